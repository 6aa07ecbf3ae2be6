import { z } from "zod";
import {
  ForecastUnavailableError,
  type ForecastDay,
  type ForecastProvider,
  type ForecastQuery,
} from "./provider";

/**
 * The forecast service's JSON API (version 1):
 *
 *   GET {base}/v1/forecast?latitude=-34.4&longitude=146.0&days=7&start=2026-12-02
 *   200 { "latitude": -34.4, "longitude": 146.0, "units": {...},
 *         "days": [ { "date": "2026-12-02", "air_temp_max_c": 31.2, "air_temp_min_c": 15.0,
 *                     "humidity_max_pct": 88, "humidity_min_pct": 31, "wind_2m_ms": 2.4,
 *                     "solar_mj_m2": 27.9, "rain_mm": 0.0 }, … ] }
 *   400 { "error": "…" } for a bad query
 *
 * `start` is optional (the service's own today when absent); `days` runs 1-16.
 */
export const forecastResponseSchema = z.object({
  latitude: z.number(),
  longitude: z.number(),
  days: z.array(
    z.object({
      date: z.iso.date(),
      air_temp_max_c: z.number().nullable(),
      air_temp_min_c: z.number().nullable(),
      humidity_max_pct: z.number().min(0).max(100).nullable(),
      humidity_min_pct: z.number().min(0).max(100).nullable(),
      wind_2m_ms: z.number().min(0).nullable(),
      solar_mj_m2: z.number().min(0).nullable(),
      rain_mm: z.number().min(0).nullable(),
    }),
  ),
});

export type ForecastResponse = z.infer<typeof forecastResponseSchema>;

export class HttpForecastProvider implements ForecastProvider {
  readonly name = "forecast-api";

  constructor(
    private readonly baseUrl: string,
    private readonly timeoutMs = 10_000,
  ) {}

  async daily(q: ForecastQuery): Promise<ForecastDay[]> {
    const url = new URL("/v1/forecast", this.baseUrl);
    url.searchParams.set("latitude", String(q.latitude));
    url.searchParams.set("longitude", String(q.longitude));
    url.searchParams.set("days", String(q.days));
    url.searchParams.set("start", q.start);
    let res: Response;
    try {
      res = await fetch(url, {
        signal: AbortSignal.timeout(this.timeoutMs),
        headers: { accept: "application/json" },
      });
    } catch (err) {
      throw new ForecastUnavailableError(
        `The forecast service did not answer (${err instanceof Error ? err.message : "network error"}).`,
      );
    }
    if (!res.ok) throw new ForecastUnavailableError(`The forecast service answered ${res.status}.`);
    const parsed = forecastResponseSchema.safeParse(await res.json().catch(() => null));
    if (!parsed.success)
      throw new ForecastUnavailableError("The forecast service's answer was not in the expected form.");
    return parsed.data.days.map((d) => ({
      date: d.date,
      tmaxC: d.air_temp_max_c,
      tminC: d.air_temp_min_c,
      rhMaxPct: d.humidity_max_pct,
      rhMinPct: d.humidity_min_pct,
      windMs: d.wind_2m_ms,
      solarMJm2: d.solar_mj_m2,
      rainMm: d.rain_mm,
    }));
  }
}
