import { tzOffset } from "@date-fns/tz";
import { dayNumberToIsoDate, isoDateToDayNumber } from "./dates";
import { requireRange, WaterBalanceInputError } from "./errors";
import { toEpochMs, type RainRecord } from "./storms";

/**
 * The reading-day rule: rain is booked to the farm's account day, which runs from the boundary hour
 * (e.g. 09:00 local) to the next and is named by the date it starts on. Manual gauges read at the
 * boundary hour are booked to the day before; daily totals from time-stamped records use the same boundary.
 */

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
export function accountDayOfManualReading(
  readAt: string | number,
  timeZone: string,
  boundaryHour: number,
): string {
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
export function dailyTotalsFromRecords(
  records: readonly RainRecord[],
  timeZone: string,
  boundaryHour: number,
): Map<string, number> {
  const out = new Map<string, number>();
  for (const g of groupRecordsByAccountDay(records, timeZone, boundaryHour)) out.set(g.date, g.rainMm);
  return out;
}
