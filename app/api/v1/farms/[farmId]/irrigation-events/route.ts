import { createIrrigationEvent, listIrrigationEvents } from "@/db/irrigation";
import { created, readJson } from "@/lib/api/handler";
import { readQuery, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { irrigationEventSchema } from "@/lib/validation/irrigation";
import { fieldDateQuerySchema } from "@/lib/validation/soil-check";

// GET /api/v1/farms/:farmId/irrigation-events — water applied, latest first (?fieldId&from&to, paginated)
export const GET = withFarmLogger("view", { tokens: false }, async ({ req, farmId }) => {
  const filter = readQuery(req, fieldDateQuerySchema);
  const page = pageQuery(req);
  const { rows, total } = await listIrrigationEvents(farmId, filter, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/irrigation-events — log water applied to a field (depth, volume, hours or meter)
export const POST = withFarmLogger("log", { tokens: false }, async ({ req, farmId, author }) => {
  const input = await readJson(req, irrigationEventSchema);
  const { event, created: isNew } = await createIrrigationEvent(farmId, author, input);
  if (!isNew) return { event };
  await recomputeSoon(farmId);
  return created({ event });
});
