import "server-only";
import type { Knex } from "knex";
import { markFieldsDirty } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import type { PageQuery } from "@/lib/api/pagination";
import type { Author } from "@/lib/auth/api-tokens";
import type { WeatherDaysInput } from "@/lib/validation/weather";
import { audit } from "./audit";
import { db } from "./knex";

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
  sunshineH: number | null;
  rainMm: number | null;
  etoMm: number | null;
  source: string | null;
  flagged: boolean;
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
  sunshine_h: number | null;
  rain_mm: number | null;
  eto_mm: number | null;
  source: string | null;
  flagged: boolean;
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
    sunshineH: r.sunshine_h,
    rainMm: r.rain_mm,
    etoMm: r.eto_mm,
    source: r.source,
    flagged: r.flagged,
  };
}

/** The farm's weather station, or a 404 naming the field that pointed at it. */
export async function requireStation(farmId: string, stationId: string, trx: Knex = db): Promise<{ id: string; name: string }> {
  const row = (await trx("weather_stations").where({ id: stationId, farm_id: farmId }).whereNull("archived_at").first("id", "name")) as
    | { id: string; name: string }
    | undefined;
  if (!row) throw new AppError("not_found", "No such weather station on this farm.", { stationId: "No such weather station on this farm" });
  return row;
}

/**
 * Stores a station's days, replacing a stored day of the same date and kind. Observed and forecast days
 * of one date live side by side: readers prefer the observed one, and a forecast kept after the day
 * shows how good it was.
 */
export async function upsertWeatherDays(farmId: string, author: Author, input: WeatherDaysInput): Promise<{ inserted: number; updated: number }> {
  const station = await requireStation(farmId, input.stationId);
  const byKey = new Map<string, Record<string, unknown>>();
  for (const d of input.days) {
    const kind = d.kind ?? input.kind;
    // The last of two days with the same date and kind wins, as a second upsert of it would.
    byKey.set(`${d.date}/${kind}`, {
      station_id: station.id,
      date: d.date,
      kind,
      tmax_c: d.tmaxC ?? null,
      tmin_c: d.tminC ?? null,
      rh_max_pct: d.rhMaxPct ?? null,
      rh_min_pct: d.rhMinPct ?? null,
      rh_mean_pct: d.rhMeanPct ?? null,
      wind_ms: d.windMs ?? null,
      solar_mj_m2: d.solarMJm2 ?? null,
      sunshine_h: d.sunshineH ?? null,
      rain_mm: d.rainMm ?? null,
      eto_mm: d.etoMm ?? null,
      source: input.source,
      created_by: author.userId,
      updated_by: author.userId,
    });
  }
  const rows = [...byKey.values()];
  const merge = Object.keys(rows[0]!).filter((k) => !["station_id", "date", "kind", "created_by"].includes(k));
  return db.transaction(async (trx) => {
    // xmax is 0 on a freshly inserted row version and set on one an upsert updated.
    const result = (await trx("weather_days")
      .insert(rows)
      .onConflict(["station_id", "date", "kind"])
      .merge(merge)
      .returning(["date", trx.raw("(xmax = 0) as inserted")])) as { date: string; inserted: boolean }[];
    const inserted = result.filter((r) => r.inserted).length;
    const dates = result.map((r) => r.date).sort();
    const fromDate = dates[0]!;
    await audit(
      {
        farmId,
        userId: author.userId,
        actor: author.actor,
        action: "upsert",
        entity: "weather_days",
        entityId: station.id,
        after: { source: input.source, inserted, updated: result.length - inserted, fromDate, toDate: dates[dates.length - 1] },
      },
      trx,
    );
    await markFieldsDirty(trx, { farmId }, fromDate);
    return { inserted, updated: result.length - inserted };
  });
}

export async function listWeatherDays(
  farmId: string,
  filter: { stationId?: string; from?: string; to?: string; kind?: "observed" | "forecast" },
  page: PageQuery,
): Promise<{ rows: WeatherDay[]; total: number }> {
  const q = db("weather_days as w").join("weather_stations as s", "s.id", "w.station_id").where("s.farm_id", farmId);
  if (filter.stationId) q.where("w.station_id", filter.stationId);
  if (filter.kind) q.where("w.kind", filter.kind);
  if (filter.from) q.where("w.date", ">=", filter.from);
  if (filter.to) q.where("w.date", "<=", filter.to);
  const [count] = (await q.clone().count("* as count")) as { count: string | number }[];
  const rows = (await q
    .select("w.*")
    .orderBy([{ column: "w.date" }, { column: "s.name" }, { column: "w.kind" }])
    .limit(page.limit)
    .offset(page.offset)) as WeatherDayRow[];
  return { rows: rows.map(toWeatherDay), total: Number(count?.count ?? 0) };
}
