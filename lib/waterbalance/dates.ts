import { WaterBalanceInputError } from "./errors";

/**
 * ISO local dates ('2026-11-30') as whole day numbers (days since 1970-01-01), so the engine can
 * step through a season with integer arithmetic and no time zone in sight. Parsing and formatting
 * are plain arithmetic (the civil-calendar algorithms of H. Hinnant), cheap enough for every day of
 * every field in a recompute.
 */

function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

function isLeap(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function digit(s: string, i: number): number {
  const c = s.charCodeAt(i) - 48;
  return c >= 0 && c <= 9 ? c : -1;
}

/** Day number (days since 1970-01-01) of an ISO local date; throws on a malformed or impossible date. */
export function isoDateToDayNumber(isoDate: string, field = "date"): number {
  if (
    typeof isoDate === "string" &&
    isoDate.length === 10 &&
    isoDate.charCodeAt(4) === 45 &&
    isoDate.charCodeAt(7) === 45
  ) {
    const d0 = digit(isoDate, 0);
    const d1 = digit(isoDate, 1);
    const d2 = digit(isoDate, 2);
    const d3 = digit(isoDate, 3);
    const m0 = digit(isoDate, 5);
    const m1 = digit(isoDate, 6);
    const a0 = digit(isoDate, 8);
    const a1 = digit(isoDate, 9);
    if ((d0 | d1 | d2 | d3 | m0 | m1 | a0 | a1) >= 0) {
      const y = d0 * 1000 + d1 * 100 + d2 * 10 + d3;
      const m = m0 * 10 + m1;
      const d = a0 * 10 + a1;
      if (m >= 1 && m <= 12 && d >= 1 && d <= (m === 2 && isLeap(y) ? 29 : MONTH_DAYS[m - 1]!))
        return daysFromCivil(y, m, d);
      throw new WaterBalanceInputError(field, `is not a calendar date ("${isoDate}")`);
    }
  }
  throw new WaterBalanceInputError(field, `must be an ISO date like 2026-11-30 (got "${String(isoDate)}")`);
}

const FORMAT_CACHE_BASE = 0; // 1970-01-01
const FORMAT_CACHE_SIZE = 60_000; // to about 2134
// filled on first use, packed (not sparse) so lookups stay fast
let formatCache: (string | null)[] | null = null;

function pad2(n: number): string {
  return n < 10 ? `0${n}` : `${n}`;
}

/** ISO local date of a day number. */
export function dayNumberToIsoDate(dayNumber: number): string {
  const slot = dayNumber - FORMAT_CACHE_BASE;
  const inCache = slot >= 0 && slot < FORMAT_CACHE_SIZE && Number.isInteger(slot);
  if (inCache) {
    formatCache ??= new Array<string | null>(FORMAT_CACHE_SIZE).fill(null);
    const hit = formatCache[slot];
    if (hit) return hit;
  }
  const z = dayNumber + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor(
    (doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365,
  );
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const d = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const m = mp < 10 ? mp + 3 : mp - 9;
  const y = yoe + era * 400 + (m <= 2 ? 1 : 0);
  const ys = y >= 0 && y <= 9999 ? String(y).padStart(4, "0") : String(y);
  const s = `${ys}-${pad2(m)}-${pad2(d)}`;
  if (inCache && formatCache) formatCache[slot] = s;
  return s;
}

/** The ISO date `days` after `isoDate` (negative goes back). */
export function addDaysIso(isoDate: string, days: number): string {
  return dayNumberToIsoDate(isoDateToDayNumber(isoDate) + days);
}

/** Whole days from `fromIso` to `toIso` (positive when `toIso` is later). */
export function daysBetweenIso(fromIso: string, toIso: string): number {
  return isoDateToDayNumber(toIso) - isoDateToDayNumber(fromIso);
}

/** Calendar year of a day number. */
export function yearOfDayNumber(dayNumber: number): number {
  const iso = dayNumberToIsoDate(dayNumber);
  return Number(iso.slice(0, iso.length - 6));
}

/** Day of the year of a day number, 1 on 1 January (FAO-56 "J"). */
export function dayOfYearOfDayNumber(dayNumber: number): number {
  return dayNumber - daysFromCivil(yearOfDayNumber(dayNumber), 1, 1) + 1;
}

/** Day of the year, 1 on 1 January (FAO-56 "J", Annex 2 Table 2.5). */
export function dayOfYear(isoDate: string): number {
  const n = isoDateToDayNumber(isoDate);
  return n - daysFromCivil(Number(isoDate.slice(0, 4)), 1, 1) + 1;
}
