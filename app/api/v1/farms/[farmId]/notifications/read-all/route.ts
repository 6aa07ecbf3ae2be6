import { markAllRead } from "@/db/notifications";
import { withFarmRole } from "@/lib/api/handler";

// POST /api/v1/farms/:farmId/notifications/read-all — mark all my alerts on this farm read
export const POST = withFarmRole("view", async ({ user, farmId }) => ({ marked: await markAllRead(user.id, farmId) }));
