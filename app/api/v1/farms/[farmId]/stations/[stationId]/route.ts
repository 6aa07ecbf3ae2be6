import { archiveWeatherStation, getWeatherStation, updateWeatherStation } from "@/db/weather-stations";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { weatherStationPatchSchema } from "@/lib/validation/weather-station";

type Params = { farmId: string; stationId: string };

function stationId(params: Params): string {
  if (!isUuid(params.stationId)) throw new AppError("not_found", "No such weather station on this farm.");
  return params.stationId;
}

// GET /api/v1/farms/:farmId/stations/:stationId — one weather station
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const station = await getWeatherStation(farmId, stationId(params));
  if (!station) throw new AppError("not_found", "No such weather station on this farm.");
  return { station };
});

// PATCH /api/v1/farms/:farmId/stations/:stationId — change a weather station
export const PATCH = withFarmRole<Params>("editSetup", async ({ req, farmId, params, user }) => {
  const id = stationId(params);
  const patch = await readJson(req, weatherStationPatchSchema);
  const station = await updateWeatherStation(farmId, user.id, id, patch);
  if (!station) throw new AppError("not_found", "No such weather station on this farm.");
  return { station };
});

// DELETE /api/v1/farms/:farmId/stations/:stationId — archive a weather station (its weather stays in past accounts)
export const DELETE = withFarmRole<Params>("editSetup", async ({ farmId, params, user }) => {
  if (!(await archiveWeatherStation(farmId, user.id, stationId(params)))) {
    throw new AppError("not_found", "No such weather station on this farm.");
  }
});
