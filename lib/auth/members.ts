import "server-only";
import { audit } from "@/db/audit";
import { db } from "@/db/knex";
import { countOwners, getRole, removeMembership, upsertMembership } from "@/db/memberships";
import { AppError } from "@/lib/api/errors";
import { assignableRoles, type Role } from "./roles";

async function memberRoleOrThrow(farmId: string, userId: string): Promise<Role> {
  const role = await getRole(userId, farmId);
  if (!role) throw new AppError("not_found", "That person is not a member of this farm.");
  return role;
}

function checkMayHandle(actorRole: Role, role: Role, verb: string): void {
  if (!assignableRoles(actorRole).includes(role)) {
    throw new AppError("forbidden", `As ${actorRole} you cannot ${verb} a ${role}.`);
  }
}

/** Changes a member's role. Managers handle workers only; a farm always keeps at least one owner. */
export async function changeMemberRole(farmId: string, actor: { id: string; role: Role }, userId: string, role: Role): Promise<void> {
  const current = await memberRoleOrThrow(farmId, userId);
  checkMayHandle(actor.role, current, "change");
  checkMayHandle(actor.role, role, "appoint");
  if (current === "owner" && role !== "owner" && (await countOwners(farmId)) <= 1) {
    throw new AppError("conflict", "A farm needs at least one owner. Make someone else owner first.");
  }
  await db.transaction(async (trx) => {
    await upsertMembership(farmId, userId, role, actor.id, trx);
    await audit({ farmId, userId: actor.id, action: "update", entity: "membership", entityId: userId, before: { role: current }, after: { role } }, trx);
  });
}

export async function removeMember(farmId: string, actor: { id: string; role: Role }, userId: string): Promise<void> {
  const current = await memberRoleOrThrow(farmId, userId);
  checkMayHandle(actor.role, current, "remove");
  if (current === "owner" && (await countOwners(farmId)) <= 1) {
    throw new AppError("conflict", "A farm needs at least one owner.");
  }
  await removeMembership(farmId, userId);
  await audit({ farmId, userId: actor.id, action: "delete", entity: "membership", entityId: userId, before: { role: current } });
}
