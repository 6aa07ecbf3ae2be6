import { tzOffset } from "@date-fns/tz";
import { dayNumberToIsoDate, isoDateToDayNumber } from "./dates";
import { requireNonNegative, requirePositive, requireRange, WaterBalanceInputError } from "./errors";

/**
 * Time-stamped rain: bucket tips and logger intervals into a hyetograph, storms separated by a dry
 * gap, and the reading-day rule that books rain to the farm's account days.
 */

/** One time-stamped catch: a bucket tip, or the depth a logger recorded over an interval. */
export interface RainRecord {
  /** end of the catch: the tip's instant, or the end of the logger interval (ISO UTC string or epoch ms) */
  at: string | number;
  /** depth caught, mm (the bucket's resolution for a tip, e.g. 0.2) */
  depthMm: number;
  /** logger interval, minutes; leave out for bucket tips */
  intervalMin?: number;
}

/** A stretch of constant intensity: `depthMm` fell evenly from `startMs` to `endMs` (epoch ms). */
export interface HyetographPiece {
  startMs: number;
  endMs: number;
  depthMm: number;
}

/** A storm: pieces with no dry gap as long as the separation gap between them. */
export interface Storm {
  startMs: number;
  endMs: number;
  depthMm: number;
  pieces: HyetographPiece[];
}

/** Options for turning records into a hyetograph. */
export interface HyetographOptions {
  /**
   * Longest time one tip's rain is spread over, minutes (default 60, common practice, no source): a tip
   * after a long quiet spell is taken to hold rain that fell in the last hour, not since the last tip.
   */
  maxTipIntervalMin?: number;
  /** Tips closer than this to the previous one are switch bounce and dropped, ms (default 1000). */
  debounceMs?: number;
}

/** Epoch milliseconds of an instant given as ISO string or epoch ms; throws on an unreadable instant. */
export function toEpochMs(at: string | number, field = "at"): number {
  const ms = typeof at === "number" ? at : Date.parse(at);
  if (!Number.isFinite(ms)) throw new WaterBalanceInputError(field, `is not a readable instant (${String(at)})`);
  return ms;
}

/**
 * Builds a hyetograph from time-stamped records. A tip's intensity comes from the time since the
 * previous tip (its bucket filled over that time), not from fixed clock windows; the first tip of a
 * burst takes the interval of the tip after it. Logger intervals spread their depth evenly.
 * @returns pieces in time order, and how many tips were dropped as bounce
 */
export function buildHyetograph(records: readonly RainRecord[], options: HyetographOptions = {}): { pieces: HyetographPiece[]; droppedTips: number } {
  const capMs = requirePositive("maxTipIntervalMin", options.maxTipIntervalMin ?? 60) * 60_000;
  const debounceMs = requireNonNegative("debounceMs", options.debounceMs ?? 1000);
  const tips: { ms: number; depthMm: number }[] = [];
  const raw: HyetographPiece[] = [];
  for (const r of records) {
    requireNonNegative("depthMm", r.depthMm);
    const ms = toEpochMs(r.at);
    if (r.depthMm === 0) continue;
    if (r.intervalMin === undefined) tips.push({ ms, depthMm: r.depthMm });
    else raw.push({ startMs: ms - requirePositive("intervalMin", r.intervalMin) * 60_000, endMs: ms, depthMm: r.depthMm });
  }
  tips.sort((a, b) => a.ms - b.ms);
  let droppedTips = 0;
  const kept: { ms: number; depthMm: number }[] = [];
  for (const t of tips) {
    const last = kept[kept.length - 1];
    if (last && t.ms - last.ms < debounceMs) {
      droppedTips++;
      continue;
    }
    kept.push(t);
  }
  for (let k = 0; k < kept.length; k++) {
    const t = kept[k]!;
    const prev = kept[k - 1];
    const next = kept[k + 1];
    let spanMs = prev ? t.ms - prev.ms : Infinity;
    if (spanMs > capMs) {
      const nextSpan = next ? next.ms - t.ms : Infinity;
      spanMs = Math.min(capMs, nextSpan);
    }
    raw.push({ startMs: t.ms - spanMs, endMs: t.ms, depthMm: t.depthMm });
  }
  raw.sort((a, b) => a.startMs - b.startMs || a.endMs - b.endMs);
  const pieces: HyetographPiece[] = [];
  for (const p of raw) {
    const last = pieces[pieces.length - 1];
    if (last && p.startMs < last.endMs) {
      // overlapping logger intervals: keep the later part, or fold a fully covered one into its neighbour
      if (p.endMs <= last.endMs) {
        last.depthMm += p.depthMm;
        continue;
      }
      pieces.push({ startMs: last.endMs, endMs: p.endMs, depthMm: p.depthMm });
      continue;
    }
    pieces.push({ ...p });
  }
  return { pieces, droppedTips };
}

/**
 * Splits a hyetograph into storms: a new storm starts after a rainless gap of at least `dryGapH`
 * hours (default 6, common practice for erosivity and runoff storms; configurable).
 */
export function separateStorms(pieces: readonly HyetographPiece[], options: { dryGapH?: number } = {}): Storm[] {
  const gapMs = requirePositive("dryGapH", options.dryGapH ?? 6) * 3_600_000;
  const storms: Storm[] = [];
  let cur: Storm | null = null;
  for (const p of pieces) {
    if (!cur || p.startMs - cur.endMs >= gapMs) {
      cur = { startMs: p.startMs, endMs: p.endMs, depthMm: 0, pieces: [] };
      storms.push(cur);
    }
    cur.pieces.push(p);
    cur.depthMm += p.depthMm;
    if (p.endMs > cur.endMs) cur.endMs = p.endMs;
  }
  return storms;
}

/** Records to storms in one step ({@link buildHyetograph} then {@link separateStorms}). */
export function stormsFromRecords(records: readonly RainRecord[], options: HyetographOptions & { dryGapH?: number } = {}): { storms: Storm[]; droppedTips: number } {
  const { pieces, droppedTips } = buildHyetograph(records, options);
  return { storms: separateStorms(pieces, options), droppedTips };
}

function localMs(utcMs: number, timeZone: string): number {
  const off = tzOffset(timeZone, new Date(utcMs));
  if (!Number.isFinite(off)) throw new WaterBalanceInputError("timeZone", `unknown time zone "${timeZone}"`);
  return utcMs + off * 60_000;
}

/**
 * The account day of rain that ended at instant `atMs`: the farm's day runs from its boundary hour
 * (e.g. 09:00 local) to the next, and is named by the date it starts on, so rain up to and including
 * 09:00 on the 30th belongs to the 29th (the reading-day rule of manual gauges, applied to records).
 * @param timeZone the farm's IANA time zone, e.g. 'Australia/Brisbane'
 * @param boundaryHour local hour the day ends at, 0-23 (may be fractional: 8.5 for 08:30)
 */
export function accountDayOfInstant(atMs: number, timeZone: string, boundaryHour: number): string {
  requireRange("boundaryHour", boundaryHour, 0, 24);
  const shifted = localMs(atMs, timeZone) - boundaryHour * 3_600_000;
  // end-inclusive: an instant exactly at the boundary closes the day before
  return dayNumberToIsoDate(Math.ceil(shifted / 86_400_000) - 1);
}

/**
 * The account day of a manual gauge reading taken at instant `readAt`: the day that ends at the
 * boundary nearest the reading, so a 09:00 (or 08:40, or 09:30) reading on the 30th is booked to the
 * 29th. Farms read once a day at a fixed hour (common practice, no source).
 */
export function accountDayOfManualReading(readAt: string | number, timeZone: string, boundaryHour: number): string {
  requireRange("boundaryHour", boundaryHour, 0, 24);
  const shifted = localMs(toEpochMs(readAt, "readAt"), timeZone) - boundaryHour * 3_600_000;
  return dayNumberToIsoDate(Math.round(shifted / 86_400_000) - 1);
}

/** The account day of a reading recorded only by its local date: the day before (reading-day rule). */
export function accountDayOfReadingDate(readingDate: string): string {
  return dayNumberToIsoDate(isoDateToDayNumber(readingDate, "readingDate") - 1);
}

/**
 * Groups time-stamped records by account day (see {@link accountDayOfInstant}), in date order, with
 * each day's total. A logger interval is booked to the day its end falls in.
 */
export function groupRecordsByAccountDay(
  records: readonly RainRecord[],
  timeZone: string,
  boundaryHour: number,
): { date: string; rainMm: number; records: RainRecord[] }[] {
  const byDay = new Map<string, { date: string; rainMm: number; records: RainRecord[] }>();
  for (const r of records) {
    const date = accountDayOfInstant(toEpochMs(r.at), timeZone, boundaryHour);
    let g = byDay.get(date);
    if (!g) {
      g = { date, rainMm: 0, records: [] };
      byDay.set(date, g);
    }
    g.records.push(r);
    g.rainMm += r.depthMm;
  }
  return [...byDay.values()].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
}

/** Daily totals (mm) by account day from time-stamped records, using the same boundary as manual readings. */
export function dailyTotalsFromRecords(records: readonly RainRecord[], timeZone: string, boundaryHour: number): Map<string, number> {
  const out = new Map<string, number>();
  for (const g of groupRecordsByAccountDay(records, timeZone, boundaryHour)) out.set(g.date, g.rainMm);
  return out;
}
