import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { changeMemberRole, removeMember } from "@/lib/auth/members";
import { isUuid } from "@/lib/auth/session";
import { memberRoleSchema } from "@/lib/validation/auth";

function memberId(userId: string): string {
  if (!isUuid(userId)) throw new AppError("not_found", "That person is not a member of this farm.");
  return userId;
}

// PATCH /api/v1/farms/:farmId/members/:userId — change a member's role
export const PATCH = withFarmRole<{ farmId: string; userId: string }>("manageMembers", async ({ req, farmId, params, user, role }) => {
  const { role: newRole } = await readJson(req, memberRoleSchema);
  await changeMemberRole(farmId, { id: user.id, role }, memberId(params.userId), newRole);
  return { userId: params.userId, role: newRole };
});

// DELETE /api/v1/farms/:farmId/members/:userId — remove a member from the farm
export const DELETE = withFarmRole<{ farmId: string; userId: string }>("manageMembers", async ({ farmId, params, user, role }) => {
  await removeMember(farmId, { id: user.id, role }, memberId(params.userId));
});
