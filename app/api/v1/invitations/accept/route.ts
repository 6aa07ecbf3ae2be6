import { readJson, withErrors } from "@/lib/api/handler";
import { acceptInvitation } from "@/lib/auth/invitations";
import { acceptInvitationSchema } from "@/lib/validation/auth";

// POST /api/v1/invitations/accept — accept an e-mailed invitation, choosing a name and password
export const POST = withErrors(async (req) => {
  const { token, name, password } = await readJson(req, acceptInvitationSchema);
  return acceptInvitation(token, name, password);
});
