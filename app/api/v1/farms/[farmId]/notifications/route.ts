import { listNotifications } from "@/db/notifications";
import { withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";

// GET /api/v1/farms/:farmId/notifications — my alerts on this farm, newest first, with the unread count (?unread=true for unread only)
export const GET = withFarmRole("view", async ({ req, user, farmId }) => {
  const query = pageQuery(req);
  const unreadOnly = new URL(req.url).searchParams.get("unread") === "true";
  const { rows, total, unread } = await listNotifications(user.id, farmId, query, unreadOnly);
  return { ...toPage(rows, query, total), unread };
});
