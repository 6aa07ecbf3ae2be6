import { createSoilCheck, listSoilChecks } from "@/db/soil-checks";
import { created, readJson } from "@/lib/api/handler";
import { readQuery, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { fieldDateQuerySchema, soilCheckSchema } from "@/lib/validation/soil-check";

// GET /api/v1/farms/:farmId/soil-checks — measured or estimated depletions, latest first (?fieldId&from&to, paginated)
export const GET = withFarmLogger("view", { tokens: false }, async ({ req, farmId }) => {
  const filter = readQuery(req, fieldDateQuerySchema);
  const page = pageQuery(req);
  const { rows, total } = await listSoilChecks(farmId, filter, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/soil-checks — log a soil check (resets the field's account unless told not to)
export const POST = withFarmLogger("log", { tokens: false }, async ({ req, farmId, author }) => {
  const input = await readJson(req, soilCheckSchema);
  const { check, created: isNew } = await createSoilCheck(farmId, author, input);
  if (!isNew) return { check };
  await recomputeSoon(farmId);
  return created({ check });
});
