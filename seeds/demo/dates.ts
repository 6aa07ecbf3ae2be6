/** Local-calendar helpers for the demo scenario; ISO dates ('2026-11-30') are farm-local days. */
import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";

const DAY_MS = 86_400_000;

/** The ISO date `days` after `iso` (calendar arithmetic, no time zone involved). */
export function addDays(iso: string, days: number): string {
  return new Date(Date.parse(`${iso}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from `a` to `b`. */
export function daysBetween(a: string, b: string): number {
  return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / DAY_MS);
}

/** Every ISO date from `from` to `to`, both included. */
export function eachDay(from: string, to: string): string[] {
  const out: string[] = [];
  for (let d = from; d <= to; d = addDays(d, 1)) out.push(d);
  return out;
}

/** Day of the year, 1-366 (the J of FAO-56 eq. 21-25). */
export function dayOfYear(iso: string): number {
  return daysBetween(`${iso.slice(0, 4)}-01-01`, iso) + 1;
}

/** The instant of a local wall-clock time on a local day; `hours` may be fractional. */
export function localInstant(iso: string, hours: number, timeZone: string): Date {
  const [y, m, d] = iso.split("-").map(Number) as [number, number, number];
  const totalS = Math.round(hours * 3600);
  // Built from wall-clock parts, not midnight + offset, so days with a daylight-saving change come out right.
  const dayShift = Math.floor(totalS / 86_400);
  const s = totalS - dayShift * 86_400;
  const wall = new TZDate(
    y,
    m - 1,
    d + dayShift,
    Math.floor(s / 3600),
    Math.floor((s % 3600) / 60),
    s % 60,
    timeZone,
  );
  return new Date(wall.getTime());
}

/** The local ISO date of an instant. */
export function localDate(instant: Date | number, timeZone: string): string {
  return format(
    new TZDate(typeof instant === "number" ? instant : instant.getTime(), timeZone),
    "yyyy-MM-dd",
  );
}
