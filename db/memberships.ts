import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/auth/roles";
import { db } from "./knex";

export interface Member {
  userId: string;
  email: string;
  name: string;
  role: Role;
  joinedAt: string;
}

export interface FarmOfUser {
  id: string;
  name: string;
  timeZone: string;
  role: Role;
}

export async function getRole(userId: string, farmId: string): Promise<Role | undefined> {
  const row = await db("memberships").where({ user_id: userId, farm_id: farmId }).first("role");
  return row?.role as Role | undefined;
}

export async function listFarmsOfUser(userId: string): Promise<FarmOfUser[]> {
  const rows = await db("memberships as m")
    .join("farms as f", "f.id", "m.farm_id")
    .where("m.user_id", userId)
    .orderBy("f.name")
    .select("f.id", "f.name", "f.time_zone", "m.role");
  return rows.map((r) => ({ id: r.id, name: r.name, timeZone: r.time_zone, role: r.role as Role }));
}

export async function listMembers(farmId: string): Promise<Member[]> {
  const rows = await db("memberships as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.farm_id", farmId)
    .orderBy("u.name")
    .select("u.id", "u.email", "u.name", "m.role", "m.created_at");
  return rows.map((r) => ({
    userId: r.id,
    email: r.email,
    name: r.name,
    role: r.role as Role,
    joinedAt: new Date(r.created_at).toISOString(),
  }));
}

export async function upsertMembership(farmId: string, userId: string, role: Role, by: string, trx: Knex = db): Promise<void> {
  await trx("memberships")
    .insert({ farm_id: farmId, user_id: userId, role, created_by: by })
    .onConflict(["user_id", "farm_id"])
    .merge({ role });
}

export async function removeMembership(farmId: string, userId: string): Promise<number> {
  return db("memberships").where({ farm_id: farmId, user_id: userId }).delete();
}

export async function countOwners(farmId: string): Promise<number> {
  const row = await db("memberships").where({ farm_id: farmId, role: "owner" }).count<{ count: string }[]>({ count: "*" }).first();
  return Number(row?.count ?? 0);
}
