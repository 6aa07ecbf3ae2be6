import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";

export interface User {
  id: string;
  email: string;
  name: string;
  unitSystem: "metric" | "imperial";
}

interface UserRow {
  id: string;
  email: string;
  name: string;
  password_hash: string | null;
  unit_system: "metric" | "imperial";
  updated_at?: Date | string;
}

function toUser(row: UserRow): User {
  return { id: row.id, email: row.email, name: row.name, unitSystem: row.unit_system };
}

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function getUser(id: string): Promise<User | undefined> {
  const row = await db<UserRow>("users").where({ id }).first();
  return row ? toUser(row) : undefined;
}

export async function findUserByEmail(email: string): Promise<User | undefined> {
  const row = await db<UserRow>("users").where({ email: normaliseEmail(email) }).first();
  return row ? toUser(row) : undefined;
}

/** The user and their password hash, for the sign-in check only; the hash never leaves db/ otherwise. */
export async function findCredentials(email: string): Promise<{ user: User; passwordHash: string | null } | undefined> {
  const row = await db<UserRow>("users").where({ email: normaliseEmail(email) }).first();
  return row ? { user: toUser(row), passwordHash: row.password_hash } : undefined;
}

export async function setPasswordHash(userId: string, passwordHash: string, trx: Knex = db): Promise<void> {
  await trx("users").where({ id: userId }).update({ password_hash: passwordHash, updated_at: db.fn.now() });
}

/** Finds the user with this e-mail or creates one without a password (an invitation sets it). */
export async function findOrCreateUser(email: string, name: string): Promise<User> {
  const [row] = await db<UserRow>("users")
    .insert({ email: normaliseEmail(email), name })
    .onConflict("email")
    .merge({ email: normaliseEmail(email) })
    .returning("*");
  return toUser(row!);
}

export async function updateUserProfile(userId: string, patch: { name?: string; unitSystem?: User["unitSystem"] }): Promise<User> {
  const [row] = await db<UserRow>("users")
    .where({ id: userId })
    .update({
      ...(patch.name !== undefined ? { name: patch.name } : {}),
      ...(patch.unitSystem !== undefined ? { unit_system: patch.unitSystem } : {}),
      updated_at: db.fn.now(),
    })
    .returning("*");
  return toUser(row!);
}
