import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { requestRecompute } from "@/lib/accounts/dirty";
import {
  STATION_ACCOUNT_KEYS,
  weatherStationSchema,
  weatherStationShape,
  type WeatherStationCreate,
  type WeatherStationPatch,
  type WeatherStationValues,
} from "@/lib/validation/weather-station";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

export interface WeatherStation extends WeatherStationValues {
  id: string;
  farmId: string;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

const COLUMNS: Record<keyof WeatherStationValues, string> = {
  name: "name",
  latitude: "latitude",
  longitude: "longitude",
  elevationM: "elevation_m",
  windHeightM: "wind_height_m",
  coastal: "coastal",
};
const KEYS = Object.keys(weatherStationShape) as (keyof WeatherStationValues)[];

type Row = Record<string, unknown> & { id: string; farm_id: string; archived_at: Date | null };

export function toWeatherStation(r: Row): WeatherStation {
  const values = Object.fromEntries(KEYS.map((k) => [k, r[COLUMNS[k]] ?? null])) as unknown as WeatherStationValues;
  return {
    id: r.id,
    farmId: r.farm_id,
    ...values,
    archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
    createdAt: (r.created_at as Date).toISOString(),
    updatedAt: (r.updated_at as Date).toISOString(),
  };
}

function toColumns(v: WeatherStationValues): Record<string, unknown> {
  return Object.fromEntries(KEYS.map((k) => [COLUMNS[k], v[k]]));
}

function valuesOf(s: WeatherStation): WeatherStationValues {
  return Object.fromEntries(KEYS.map((k) => [k, s[k]])) as unknown as WeatherStationValues;
}

/** Leaves out keys sent as undefined, so they do not overwrite a default. */
function defined<T extends object>(v: T): Partial<T> {
  return Object.fromEntries(Object.entries(v).filter(([, x]) => x !== undefined)) as Partial<T>;
}

/** The farm's stations in use, by name; archived ones only when asked for. */
export async function listWeatherStations(farmId: string, page: PageQuery, includeArchived = false): Promise<{ rows: WeatherStation[]; total: number }> {
  const base = db("weather_stations")
    .where({ farm_id: farmId })
    .modify((q) => {
      if (!includeArchived) q.whereNull("archived_at");
    });
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base.clone().orderBy(["name", "id"]).limit(page.limit).offset(page.offset).select("*")) as Row[];
  return { rows: rows.map(toWeatherStation), total: Number(n) };
}

export async function getWeatherStation(farmId: string, id: string): Promise<WeatherStation | undefined> {
  const row = (await db("weather_stations").where({ id, farm_id: farmId }).first()) as Row | undefined;
  return row ? toWeatherStation(row) : undefined;
}

async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
  const taken = await trx("weather_stations")
    .where({ farm_id: farmId, name })
    .whereNull("archived_at")
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .first("id");
  if (taken) throw new AppError("conflict", "This farm already has a weather station with that name.", { name: "Already used by another station on this farm" });
}

export async function createWeatherStation(farmId: string, userId: string, input: WeatherStationCreate): Promise<{ station: WeatherStation; created: boolean }> {
  const { id, ...given } = input;
  const values = weatherStationSchema.parse({ latitude: null, longitude: null, elevationM: null, ...defined(given) });
  return db.transaction(async (trx) => {
    if (id) {
      const existing = (await trx("weather_stations").where({ id }).first()) as Row | undefined;
      if (existing?.farm_id === farmId) return { station: toWeatherStation(existing), created: false };
    }
    await checkNameFree(trx, farmId, values.name, null);
    const { row, created } = await insertOnce<Row>(
      trx,
      "weather_stations",
      { ...(id ? { id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
      (r) => r.farm_id === farmId,
    );
    const station = toWeatherStation(row);
    if (created) await audit({ farmId, userId, action: "create", entity: "weather_station", entityId: station.id, after: station }, trx);
    return { station, created };
  });
}

export async function updateWeatherStation(farmId: string, userId: string, id: string, patch: WeatherStationPatch): Promise<WeatherStation | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = (await trx("weather_stations").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return undefined;
    const before = toWeatherStation(row);
    const values = weatherStationSchema.parse({ ...valuesOf(before), ...patch });
    if (values.name !== before.name && !before.archivedAt) await checkNameFree(trx, farmId, values.name, id);
    const [updated] = (await trx("weather_stations").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    const after = toWeatherStation(updated!);
    await audit({ farmId, userId, action: "update", entity: "weather_station", entityId: id, before, after }, trx);
    let dirty = false;
    if (STATION_ACCOUNT_KEYS.some((k) => before[k] !== after[k])) {
      // Every field of the farm takes its reference ET from the farm's weather.
      const fieldIds = (await trx("fields").where({ farm_id: farmId }).pluck("id")) as string[];
      dirty = await markFieldsFromPlantings(trx, fieldIds);
    }
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}

/** Archives a station: its weather days stay part of past accounts. */
export async function archiveWeatherStation(farmId: string, userId: string, id: string): Promise<boolean> {
  return db.transaction(async (trx) => {
    const row = (await trx("weather_stations").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return false;
    if (row.archived_at) return true;
    const [updated] = (await trx("weather_stations").where({ id }).update({ archived_at: trx.fn.now(), updated_by: userId }).returning("*")) as Row[];
    await audit({ farmId, userId, action: "archive", entity: "weather_station", entityId: id, before: toWeatherStation(row), after: toWeatherStation(updated!) }, trx);
    return true;
  });
}
