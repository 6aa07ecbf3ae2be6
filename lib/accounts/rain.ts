import type { AccountField } from "@/db/account-inputs";
import { rainFromGauges, type GaugeReading, type GaugeWeight, type RainDayInput } from "@/lib/waterbalance";
import type { FarmInputContext } from "./inputs";
import { nextIsoDate } from "./station-eto";

/**
 * A field's rain by account day: its own gauge, else inverse-distance weighting of the farm's gauges.
 */

/** Fields without their own gauge take rain from gauges this close, km (engine default, common practice). */
export const RAIN_RADIUS_KM = 10;

/** The located gauges' readings of one date, worked out once per farm run and shared by its fields. */
export interface GaugeDayReadings {
  /** '1' for a gauge with a reading, '0' without, in locatedGauges order */
  key: string;
  values: (number | null)[];
  anyFlagged: boolean;
}

function gaugeDay(ctx: FarmInputContext, date: string): GaugeDayReadings {
  let day = ctx.gaugeDayCache.get(date);
  if (day) return day;
  let key = "";
  let anyFlagged = false;
  const values: (number | null)[] = [];
  for (const g of ctx.locatedGauges) {
    const d = ctx.gaugeDays.get(g.id)?.get(date);
    // A recording gauge that logged no tip on a day caught no rain; a manual gauge not read is missing.
    const mm = d ? (Number.isNaN(d.rainMm) ? null : d.rainMm) : g.recording ? 0 : null;
    if (d?.flagged) anyFlagged = true;
    values.push(mm);
    key += mm === null ? "0" : "1";
  }
  day = { key, values, anyFlagged };
  ctx.gaugeDayCache.set(date, day);
  return day;
}

/** Where one day's rain came from, for the provenance (dry days included, which the engine is not told of). */
export interface DayRainSource {
  source: "own-gauge" | "idw" | "no-record";
  gauges: readonly GaugeWeight[];
  missing: boolean;
  recorded: boolean;
}

const NO_RAIN_RECORD: DayRainSource = Object.freeze({ source: "no-record", gauges: Object.freeze([]) as readonly [], missing: false, recorded: false });

/**
 * A field's rain by account day: its own gauge, else inverse-distance weighting of the farm's located
 * gauges within {@link RAIN_RADIUS_KM}. The engine gets the wet and the missing days (a dry day and an
 * absent one are the same to the balance); `sources` keeps every day's origin for the provenance.
 */
export function fieldRain(
  ctx: FarmInputContext,
  field: AccountField,
  from: string,
  to: string,
): { rain: RainDayInput[]; sources: DayRainSource[]; qc: Map<string, string> } {
  const rain: RainDayInput[] = [];
  const sources: DayRainSource[] = [];
  const qc = new Map<string, string>();
  const own = field.gaugeId ? ctx.gaugeDays.get(field.gaugeId) : undefined;
  const ownWeight: GaugeWeight[] = field.gaugeId ? [{ gaugeId: field.gaugeId, distanceKm: 0, weight: 1 }] : [];
  const ownTotal: DayRainSource = { source: "own-gauge", gauges: ownWeight, missing: false, recorded: false };
  const ownRecorded: DayRainSource = { ...ownTotal, recorded: true };
  const ownIsRecording = ctx.setup.gauges.some((g) => g.id === field.gaugeId && g.kind === "recording");
  const lat = field.centroidLat ?? ctx.setup.farm.latitude;
  const lon = field.centroidLon ?? ctx.setup.farm.longitude;
  const target = lat !== null && lon !== null ? { latitudeDeg: lat, longitudeDeg: lon } : null;
  // Weights depend only on which gauges have a reading, so each pattern is weighed once per field.
  const weightCache = new Map<string, { weights: GaugeWeight[]; found: DayRainSource; missing: DayRainSource }>();
  const readings: GaugeReading[] = ctx.locatedGauges.map((g) => ({ gaugeId: g.id, latitudeDeg: g.latitude, longitudeDeg: g.longitude, rainMm: null }));
  for (let date = from; date <= to; date = nextIsoDate(date)) {
    const mine = own?.get(date);
    if (mine) {
      if (mine.flagged) qc.set(date, Number.isNaN(mine.rainMm) ? "rain-flagged-excluded" : "rain-flagged-counted");
      if (!Number.isNaN(mine.rainMm)) {
        const source = { kind: "own-gauge" as const, gauges: ownWeight };
        if (mine.records) rain.push({ date, kind: "records", records: mine.records, source });
        else if (mine.rainMm > 0) rain.push({ date, kind: "total", rainMm: mine.rainMm, source });
        sources.push(mine.records ? ownRecorded : ownTotal);
        continue;
      }
    } else if (ownIsRecording) {
      // A recording gauge that logged no tip caught no rain: the field's own dry day, not a gap to fill.
      sources.push(ownTotal);
      continue;
    }
    if (!target || readings.length === 0) {
      sources.push(NO_RAIN_RECORD);
      continue;
    }
    const day = gaugeDay(ctx, date);
    const key = day.key;
    const anyFlagged = day.anyFlagged;
    for (let k = 0; k < readings.length; k++) readings[k]!.rainMm = day.values[k]!;
    if (!key.includes("1")) {
      sources.push(NO_RAIN_RECORD);
      continue;
    }
    if (anyFlagged) qc.set(date, ctx.setup.farm.countFlaggedValues ? "rain-flagged-counted" : "rain-flagged-excluded");
    let cached = weightCache.get(key);
    if (!cached) {
      const weights = rainFromGauges(target, readings, { radiusKm: RAIN_RADIUS_KM }).gauges;
      cached = {
        weights,
        found: { source: "idw", gauges: weights, missing: false, recorded: false },
        missing: { source: "idw", gauges: weights, missing: true, recorded: false },
      };
      weightCache.set(key, cached);
    }
    if (cached.weights.length === 0) {
      rain.push({ date, kind: "total", rainMm: null, source: { kind: "idw", gauges: cached.weights } });
      sources.push(cached.missing);
      continue;
    }
    let mm = 0;
    for (const w of cached.weights) mm += w.weight * (readings.find((r) => r.gaugeId === w.gaugeId)?.rainMm ?? 0);
    if (mm > 0) rain.push({ date, kind: "total", rainMm: mm, source: { kind: "idw", gauges: cached.weights } });
    sources.push(cached.found);
  }
  return { rain, sources, qc };
}

