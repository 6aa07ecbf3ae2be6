import { createWeatherStation, listWeatherStations } from "@/db/weather-stations";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { weatherStationCreateSchema } from "@/lib/validation/weather-station";

// GET /api/v1/farms/:farmId/stations — the farm's weather stations (?includeArchived=true for all)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const includeArchived = req.nextUrl.searchParams.get("includeArchived") === "true";
  const { rows, total } = await listWeatherStations(farmId, page, includeArchived);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/stations — add a weather station
export const POST = withFarmRole("editSetup", async ({ req, farmId, user }) => {
  const input = await readJson(req, weatherStationCreateSchema);
  const { station, created: isNew } = await createWeatherStation(farmId, user.id, input);
  return isNew ? created({ station }) : { station };
});
