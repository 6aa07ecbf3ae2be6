import { withFarmRole } from "@/lib/api/handler";
import { runAlerts } from "@/lib/jobs/alerts";

// POST /api/v1/farms/:farmId/alerts/check — evaluate the farm's alert conditions now (the worker also does after each recompute and nightly)
export const POST = withFarmRole("editSetup", async ({ farmId }) => {
  const run = await runAlerts(farmId);
  return { conditions: run.conditions, created: run.created, deliveries: run.deliveries, delivered: run.delivered };
});
