import { listMembers } from "@/db/memberships";
import { withFarmRole } from "@/lib/api/handler";

// GET /api/v1/farms/:farmId/members — the farm's members and their roles
export const GET = withFarmRole("manageMembers", async ({ farmId }) => ({ data: await listMembers(farmId) }));
