import { createGauge, listGauges } from "@/db/gauges";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { gaugeCreateSchema } from "@/lib/validation/gauge";

// GET /api/v1/farms/:farmId/gauges — the farm's rain gauges (?includeArchived=true for all)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const includeArchived = req.nextUrl.searchParams.get("includeArchived") === "true";
  const { rows, total } = await listGauges(farmId, page, includeArchived);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/gauges — add a rain gauge
export const POST = withFarmRole("editSetup", async ({ req, farmId, user }) => {
  const input = await readJson(req, gaugeCreateSchema);
  const { gauge, created: isNew } = await createGauge(farmId, user.id, input);
  return isNew ? created({ gauge }) : { gauge };
});
