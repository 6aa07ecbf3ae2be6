import { listFarmsOfUser } from "@/db/memberships";
import { withUser } from "@/lib/api/handler";

// GET /api/v1/farms — the farms the signed-in person belongs to, with their role on each
export const GET = withUser(async ({ user }) => ({ data: await listFarmsOfUser(user.id) }));
