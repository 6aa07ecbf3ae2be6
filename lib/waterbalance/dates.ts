import { WaterBalanceInputError } from "./errors";

/**
 * ISO local dates ('2026-11-30') as whole day numbers (days since 1970-01-01), so the engine can
 * step through a season with integer arithmetic and no time zone in sight.
 */

const MS_PER_DAY = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Day number (days since 1970-01-01) of an ISO local date; throws on a malformed or impossible date. */
export function isoDateToDayNumber(isoDate: string, field = "date"): number {
  const m = ISO_DATE.exec(isoDate);
  if (!m) throw new WaterBalanceInputError(field, `must be an ISO date like 2026-11-30 (got "${isoDate}")`);
  const y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  const ms = Date.UTC(y, mo - 1, d);
  const back = new Date(ms);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) {
    throw new WaterBalanceInputError(field, `is not a calendar date ("${isoDate}")`);
  }
  return Math.round(ms / MS_PER_DAY);
}

/** ISO local date of a day number. */
export function dayNumberToIsoDate(dayNumber: number): string {
  return new Date(dayNumber * MS_PER_DAY).toISOString().slice(0, 10);
}

/** The ISO date `days` after `isoDate` (negative goes back). */
export function addDaysIso(isoDate: string, days: number): string {
  return dayNumberToIsoDate(isoDateToDayNumber(isoDate) + days);
}

/** Whole days from `fromIso` to `toIso` (positive when `toIso` is later). */
export function daysBetweenIso(fromIso: string, toIso: string): number {
  return isoDateToDayNumber(toIso) - isoDateToDayNumber(fromIso);
}

/** Day of the year, 1 on 1 January (FAO-56 "J", Annex 2 Table 2.5). */
export function dayOfYear(isoDate: string): number {
  const n = isoDateToDayNumber(isoDate);
  const year = Number(isoDate.slice(0, 4));
  return n - Math.round(Date.UTC(year, 0, 1) / MS_PER_DAY) + 1;
}

/** Day of the year of a day number. */
export function dayOfYearOfDayNumber(dayNumber: number): number {
  const year = new Date(dayNumber * MS_PER_DAY).getUTCFullYear();
  return dayNumber - Math.round(Date.UTC(year, 0, 1) / MS_PER_DAY) + 1;
}
