/**
 * Quiet hours and the digest hour, in the farm's own time zone. Pure: instants in, instants out.
 */
import { TZDate } from "@date-fns/tz";

export interface QuietHours {
  /** "HH:MM" local; when start > end the quiet spans midnight */
  start: string;
  end: string;
}

function minutesOf(hhmm: string): number {
  const [h, m] = hhmm.split(":").map(Number);
  return (h ?? 0) * 60 + (m ?? 0);
}

/** The local instant at minute-of-day `minute`, `dayOffset` days after `local`'s day. */
function atLocalMinute(local: TZDate, dayOffset: number, minute: number): Date {
  const d = new TZDate(local.getFullYear(), local.getMonth(), local.getDate() + dayOffset, Math.floor(minute / 60), minute % 60, 0, local.timeZone);
  return new Date(d.getTime());
}

/** True when `now` falls inside the quiet hours (start inclusive, end exclusive). */
export function isQuiet(now: Date, timeZone: string, quiet: QuietHours | null): boolean {
  if (!quiet || quiet.start === quiet.end) return false;
  const local = new TZDate(now.getTime(), timeZone);
  const m = local.getHours() * 60 + local.getMinutes();
  const s = minutesOf(quiet.start);
  const e = minutesOf(quiet.end);
  return s < e ? m >= s && m < e : m >= s || m < e;
}

/**
 * When a message made at `now` may go out: `now` itself outside quiet hours, else the moment they end.
 * Nothing is dropped in quiet hours, only held.
 */
export function nextSendTime(now: Date, timeZone: string, quiet: QuietHours | null): Date {
  if (!quiet || !isQuiet(now, timeZone, quiet)) return now;
  const local = new TZDate(now.getTime(), timeZone);
  const m = local.getHours() * 60 + local.getMinutes();
  const e = minutesOf(quiet.end);
  return atLocalMinute(local, m < e ? 0 : 1, e);
}

/** The next local `hour`:00 at or after `now`, for the daily digest. */
export function nextDigestTime(now: Date, timeZone: string, hour: number): Date {
  const local = new TZDate(now.getTime(), timeZone);
  const today = atLocalMinute(local, 0, hour * 60);
  return today.getTime() >= now.getTime() ? today : atLocalMinute(local, 1, hour * 60);
}
