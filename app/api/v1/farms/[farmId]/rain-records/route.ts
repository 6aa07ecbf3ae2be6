import { insertRainRecords, listRainRecords } from "@/db/rain";
import { readJson } from "@/lib/api/handler";
import { readQuery, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { requireTokenScope } from "@/lib/auth/api-tokens";
import { rainRecordQuerySchema, rainRecordsSchema } from "@/lib/validation/rain";

// GET /api/v1/farms/:farmId/rain-records — time-stamped rain records in time order (?gaugeId&from&to instants, paginated)
export const GET = withFarmLogger("view", { tokens: false }, async ({ req, farmId }) => {
  const filter = readQuery(req, rainRecordQuerySchema);
  const page = pageQuery(req);
  const { rows, total } = await listRainRecords(farmId, filter, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/rain-records — a batch of tips or logger intervals; repeats are counted, not stored
export const POST = withFarmLogger("log", { tokens: true }, async ({ req, farmId, author, token }) => {
  const input = await readJson(req, rainRecordsSchema);
  requireTokenScope(token, { gaugeId: input.gaugeId });
  const result = await insertRainRecords(farmId, author, input);
  if (result.inserted > 0) await recomputeSoon(farmId);
  return result;
});
