import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";

/** One day of a station's weather in the engine's units; `kind` says whether it was measured or forecast. */
export interface WeatherDay {
  id: string;
  stationId: string;
  date: string;
  kind: "observed" | "forecast";
  tmaxC: number | null;
  tminC: number | null;
  rhMaxPct: number | null;
  rhMinPct: number | null;
  rhMeanPct: number | null;
  windMs: number | null;
  solarMJm2: number | null;
  rainMm: number | null;
  source: string | null;
  flagged: boolean;
  flagReason: string | null;
}

interface WeatherDayRow {
  id: string;
  station_id: string;
  date: string;
  kind: "observed" | "forecast";
  tmax_c: number | null;
  tmin_c: number | null;
  rh_max_pct: number | null;
  rh_min_pct: number | null;
  rh_mean_pct: number | null;
  wind_ms: number | null;
  solar_mj_m2: number | null;
  rain_mm: number | null;
  source: string | null;
  flagged: boolean;
  flag_reason: string | null;
}

export function toWeatherDay(r: WeatherDayRow): WeatherDay {
  return {
    id: r.id,
    stationId: r.station_id,
    date: r.date,
    kind: r.kind,
    tmaxC: r.tmax_c,
    tminC: r.tmin_c,
    rhMaxPct: r.rh_max_pct,
    rhMinPct: r.rh_min_pct,
    rhMeanPct: r.rh_mean_pct,
    windMs: r.wind_ms,
    solarMJm2: r.solar_mj_m2,
    rainMm: r.rain_mm,
    source: r.source,
    flagged: r.flagged,
    flagReason: r.flag_reason,
  };
}

export interface DayValues {
  date: string;
  tmaxC: number | null;
  tminC: number | null;
  rhMaxPct: number | null;
  rhMinPct: number | null;
  rhMeanPct: number | null;
  windMs: number | null;
  solarMJm2: number | null;
  rainMm: number | null;
}

/** The weather_days columns of a day's values (kind, station and attribution are the caller's). */
export function weatherColumns(d: DayValues): Record<string, string | number | null> {
  return {
    date: d.date,
    tmax_c: d.tmaxC,
    tmin_c: d.tminC,
    rh_max_pct: d.rhMaxPct,
    rh_min_pct: d.rhMinPct,
    rh_mean_pct: d.rhMeanPct,
    wind_ms: d.windMs,
    solar_mj_m2: d.solarMJm2,
    rain_mm: d.rainMm,
  };
}

export const WEATHER_VALUE_COLUMNS = [
  "tmax_c",
  "tmin_c",
  "rh_max_pct",
  "rh_min_pct",
  "rh_mean_pct",
  "wind_ms",
  "solar_mj_m2",
  "rain_mm",
];

export interface ForecastStation {
  id: string;
  name: string;
  latitude: number;
  longitude: number;
}

/**
 * The farm's live stations with a place to forecast for: the station's own coordinates, else the
 * farm's. A station with neither is left out (nowhere to ask about).
 */
export async function forecastStations(farmId: string): Promise<ForecastStation[]> {
  const rows = (await db("weather_stations as s")
    .join("farms as f", "f.id", "s.farm_id")
    .where("s.farm_id", farmId)
    .whereNull("s.archived_at")
    .orderBy("s.name")
    .select(
      "s.id",
      "s.name",
      db.raw("coalesce(s.latitude, f.latitude) as latitude"),
      db.raw("coalesce(s.longitude, f.longitude) as longitude"),
    )) as {
    id: string;
    name: string;
    latitude: number | null;
    longitude: number | null;
  }[];
  return rows.flatMap((r) =>
    r.latitude === null || r.longitude === null
      ? []
      : [{ id: r.id, name: r.name, latitude: r.latitude, longitude: r.longitude }],
  );
}

/**
 * Replaces a station's forecast from `fromDate` on with `days`. Forecast rows have their own kind, so an
 * observed day is never touched; readers take the observed row where both exist.
 */
export async function replaceForecast(
  trx: Knex.Transaction,
  stationId: string,
  fromDate: string,
  days: DayValues[],
  source: string,
): Promise<{ removed: number; inserted: number }> {
  const removed = await trx("weather_days")
    .where({ station_id: stationId, kind: "forecast" })
    .where("date", ">=", fromDate)
    .delete();
  if (days.length > 0) {
    await trx("weather_days").insert(
      days.map((d) => ({ ...weatherColumns(d), station_id: stationId, kind: "forecast", source })),
    );
  }
  return { removed, inserted: days.length };
}

/** A station's days in a range, one per date: the observed row where there is one, else the forecast. */
export async function weatherPreferObserved(
  stationId: string,
  fromDate: string,
  toDate: string,
): Promise<WeatherDay[]> {
  const rows = (await db
    .select("*")
    .from(
      db("weather_days")
        .distinctOn("date")
        .where({ station_id: stationId })
        .whereBetween("date", [fromDate, toDate])
        .orderByRaw("date, (kind = 'observed') desc")
        .select("*")
        .as("d"),
    )
    .orderBy("date")) as WeatherDayRow[];
  return rows.map(toWeatherDay);
}
