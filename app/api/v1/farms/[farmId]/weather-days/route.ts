import { listWeatherDays, upsertWeatherDays } from "@/db/weather";
import { readJson } from "@/lib/api/handler";
import { readQuery, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { requireTokenScope } from "@/lib/auth/api-tokens";
import { weatherDaysSchema, weatherQuerySchema } from "@/lib/validation/weather";

// GET /api/v1/farms/:farmId/weather-days — station days in date order (?stationId&from&to&kind, paginated)
export const GET = withFarmLogger("view", { tokens: false }, async ({ req, farmId }) => {
  const filter = readQuery(req, weatherQuerySchema);
  const page = pageQuery(req);
  const { rows, total } = await listWeatherDays(farmId, filter, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/weather-days — observed or forecast days of a station, replacing same date and kind
export const POST = withFarmLogger("log", { tokens: true }, async ({ req, farmId, author, token }) => {
  const input = await readJson(req, weatherDaysSchema);
  requireTokenScope(token, { stationId: input.stationId });
  const result = await upsertWeatherDays(farmId, author, input);
  await recomputeSoon(farmId);
  return result;
});
