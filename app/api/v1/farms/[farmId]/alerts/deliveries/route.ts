import { deliveryLog } from "@/db/notifications";
import { withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";

// GET /api/v1/farms/:farmId/alerts/deliveries — the sent log: each push and e-mail, to whom, and how it ended
export const GET = withFarmRole("manageMembers", async ({ req, farmId }) => {
  const query = pageQuery(req);
  const { rows, total } = await deliveryLog(farmId, query);
  return toPage(rows, query, total);
});
