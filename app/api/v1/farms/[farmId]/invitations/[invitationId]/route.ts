import { audit } from "@/db/audit";
import { revokeInvitation } from "@/db/invitations";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";

// DELETE /api/v1/farms/:farmId/invitations/:invitationId — withdraw an invitation
export const DELETE = withFarmRole<{ farmId: string; invitationId: string }>("manageMembers", async ({ farmId, params, user }) => {
  const removed = isUuid(params.invitationId) ? await revokeInvitation(farmId, params.invitationId) : 0;
  if (removed === 0) throw new AppError("not_found", "No open invitation with that id.");
  await audit({ farmId, userId: user.id, action: "delete", entity: "invitation", entityId: params.invitationId });
});
