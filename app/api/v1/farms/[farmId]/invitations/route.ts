import { listOpenInvitations } from "@/db/invitations";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { inviteMember } from "@/lib/auth/invitations";
import { invitationSchema } from "@/lib/validation/auth";

// GET /api/v1/farms/:farmId/invitations — invitations not yet accepted
export const GET = withFarmRole("manageMembers", async ({ farmId }) => ({ data: await listOpenInvitations(farmId) }));

// POST /api/v1/farms/:farmId/invitations — invite someone by e-mail
export const POST = withFarmRole("manageMembers", async ({ req, farmId, user, role }) => {
  const input = await readJson(req, invitationSchema);
  return created({ invitation: await inviteMember(farmId, user, role, input) });
});
