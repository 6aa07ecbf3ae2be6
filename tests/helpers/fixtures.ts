import { randomUUID } from "node:crypto";
import bcrypt from "bcryptjs";
import { db } from "@/db/knex";
import type { Role } from "@/lib/auth/roles";

export interface TestUser {
  id: string;
  email: string;
  name: string;
  password: string;
}

export const TEST_PASSWORD = "correct horse battery";
const hash = bcrypt.hashSync(TEST_PASSWORD, 4);

export async function createUser(label: string): Promise<TestUser> {
  const email = `${label}-${randomUUID().slice(0, 8)}@test.rootbank.example`;
  const [row] = await db("users").insert({ email, name: `Test ${label}`, password_hash: hash }).returning("id");
  return { id: row.id, email, name: `Test ${label}`, password: TEST_PASSWORD };
}

export async function createFarm(name = "Test farm"): Promise<string> {
  const [row] = await db("farms")
    .insert({ name: `${name} ${randomUUID().slice(0, 6)}`, time_zone: "Australia/Sydney", latitude: -34.4, longitude: 146.0 })
    .returning("id");
  return row.id;
}

export type FarmTeam = { farmId: string; outsider: TestUser } & Record<Role, TestUser>;

/** A farm with one member per role, plus an outsider who belongs to another farm only. */
export async function createFarmTeam(): Promise<FarmTeam> {
  const farmId = await createFarm();
  const otherFarmId = await createFarm("Other farm");
  const roles: Role[] = ["owner", "manager", "agronomist", "worker", "viewer"];
  const team = { farmId } as FarmTeam;
  for (const role of roles) {
    const user = await createUser(role);
    await db("memberships").insert({ user_id: user.id, farm_id: farmId, role });
    team[role] = user;
  }
  team.outsider = await createUser("outsider");
  await db("memberships").insert({ user_id: team.outsider.id, farm_id: otherFarmId, role: "owner" });
  return team;
}
