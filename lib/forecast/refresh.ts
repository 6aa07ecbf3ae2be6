import "server-only";
import { audit } from "@/db/audit";
import { forecastStations, replaceForecast, type DayValues } from "@/db/forecast";
import { getFarm } from "@/db/farms";
import { db } from "@/db/knex";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { env } from "@/lib/env";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";
import { HttpForecastProvider } from "./http";
import { ForecastUnavailableError, type ForecastDay, type ForecastProvider } from "./provider";

export const DEFAULT_FORECAST_DAYS = 7;

/** The configured forecast service, or a 503 saying none is configured. */
export function defaultForecastProvider(): ForecastProvider {
  const url = env().FORECAST_API_URL;
  if (!url) throw new AppError("unavailable", "No forecast service is configured (FORECAST_API_URL).");
  return new HttpForecastProvider(url);
}

/** Keeps what the weather_days CHECKs accept: a value that breaks one is dropped, not the whole day. */
function storable(d: ForecastDay): DayValues {
  const within = (v: number | null, lo: number, hi: number) => (v !== null && v >= lo && v <= hi ? v : null);
  let tmaxC = within(d.tmaxC, -90, 60);
  let tminC = within(d.tminC, -90, 60);
  if (tmaxC !== null && tminC !== null && tmaxC < tminC) [tmaxC, tminC] = [null, null];
  let rhMaxPct = within(d.rhMaxPct, 0, 100);
  let rhMinPct = within(d.rhMinPct, 0, 100);
  if (rhMaxPct !== null && rhMinPct !== null && rhMinPct > rhMaxPct) [rhMaxPct, rhMinPct] = [null, null];
  return {
    date: d.date,
    tmaxC,
    tminC,
    rhMaxPct,
    rhMinPct,
    rhMeanPct: null,
    windMs: within(d.windMs, 0, 60),
    solarMJm2: within(d.solarMJm2, 0, 50),
    rainMm: within(d.rainMm, 0, 1000),
  };
}

export interface RefreshResult {
  from: string;
  to: string;
  stations: { stationId: string; name: string; days: number; replaced: number }[];
}

/**
 * Fetches the next `days` days for each of the farm's stations and stores them as weather_days of kind
 * 'forecast', replacing that station's forecast rows from the farm's today on. Observed rows are a
 * different kind and are never touched; readers prefer them (db/forecast weatherPreferObserved).
 * @param opts.userId the person who asked (audited); absent for the nightly job
 */
export async function refreshForecast(
  farmId: string,
  opts: { provider?: ForecastProvider; days?: number; userId?: string; now?: Date } = {},
): Promise<RefreshResult> {
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  const provider = opts.provider ?? defaultForecastProvider();
  const days = opts.days ?? DEFAULT_FORECAST_DAYS;
  const from = farmToday(farm.timeZone, opts.now);
  const to = addDaysIso(from, days - 1);
  const stations = await forecastStations(farmId);
  if (stations.length === 0) {
    throw new AppError(
      "invalid",
      "The farm has no weather station with a location (or a farm location) to forecast for.",
    );
  }
  const fetched: { station: (typeof stations)[number]; values: DayValues[] }[] = [];
  for (const station of stations) {
    let got: ForecastDay[];
    try {
      got = await provider.daily({
        latitude: station.latitude,
        longitude: station.longitude,
        days,
        start: from,
      });
    } catch (err) {
      if (err instanceof ForecastUnavailableError) throw new AppError("unavailable", err.message);
      throw err;
    }
    // Only the days asked for, once each: a service that strays outside them is not trusted there.
    const unique = new Map(
      got.filter((d) => d.date >= from && d.date <= to).map((d) => [d.date, storable(d)]),
    );
    fetched.push({ station, values: [...unique.values()].sort((a, b) => a.date.localeCompare(b.date)) });
  }
  const result: RefreshResult = { from, to, stations: [] };
  await db.transaction(async (trx) => {
    for (const { station, values } of fetched) {
      const { removed, inserted } = await replaceForecast(trx, station.id, from, values, provider.name);
      result.stations.push({ stationId: station.id, name: station.name, days: inserted, replaced: removed });
    }
    await markFieldsDirty(trx, { farmId }, from);
    await audit(
      {
        farmId,
        userId: opts.userId ?? null,
        action: "forecast.refresh",
        entity: "farm",
        entityId: farmId,
        after: result,
      },
      trx,
    );
  });
  await requestRecompute(farmId);
  return result;
}
