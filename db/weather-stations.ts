import "server-only";
import { STATION_ACCOUNT_KEYS, weatherStationSchema, type WeatherStationCreate, type WeatherStationValues } from "@/lib/validation/weather-station";
import { farmEquipment, type Equipment } from "./farm-equipment";

export type WeatherStation = Equipment<WeatherStationValues>;

const stations = farmEquipment<WeatherStationValues>({
  table: "weather_stations",
  entity: "weather_station",
  columns: {
    name: "name",
    latitude: "latitude",
    longitude: "longitude",
    elevationM: "elevation_m",
    windHeightM: "wind_height_m",
    coastal: "coastal",
  },
  schema: weatherStationSchema,
  createDefaults: { latitude: null, longitude: null, elevationM: null },
  nameTaken: { message: "This farm already has a weather station with that name.", field: "Already used by another station on this farm" },
  accountKeys: STATION_ACCOUNT_KEYS,
  // Every field of the farm takes its reference ET from the farm's weather.
  fieldsUsing: (trx, farmId) => trx("fields").where({ farm_id: farmId }).pluck("id"),
});

export const toWeatherStation = stations.toItem;

/** The farm's stations in use, by name; archived ones only when asked for. */
export const listWeatherStations = stations.list;

export const getWeatherStation = stations.get;

export async function createWeatherStation(
  farmId: string,
  userId: string,
  input: WeatherStationCreate,
): Promise<{ station: WeatherStation; created: boolean }> {
  const { item, created } = await stations.create(farmId, userId, input);
  return { station: item, created };
}

export const updateWeatherStation = stations.update;

/** Archives a station: its weather days stay part of past accounts. */
export const archiveWeatherStation = stations.archive;
