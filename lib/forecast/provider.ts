/**
 * Where forecast weather comes from. Rootbank asks a provider for daily values at a place; the HTTP
 * provider (./http.ts) speaks the forecast service's JSON API, and tests may pass their own provider.
 */

/** One forecast day in the engine's units; any value the service does not give is null. */
export interface ForecastDay {
  date: string;
  tmaxC: number | null;
  tminC: number | null;
  rhMaxPct: number | null;
  rhMinPct: number | null;
  windMs: number | null;
  solarMJm2: number | null;
  rainMm: number | null;
}

export interface ForecastQuery {
  latitude: number;
  longitude: number;
  /** number of days from `start` on */
  days: number;
  /** first local date wanted, usually the farm's today */
  start: string;
}

export interface ForecastProvider {
  /** a short name stored with the rows (weather_days.source) */
  readonly name: string;
  daily(query: ForecastQuery): Promise<ForecastDay[]>;
}

export class ForecastUnavailableError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ForecastUnavailableError";
  }
}
