import { TZDate } from "@date-fns/tz";
import { format, formatISO } from "date-fns";

/*
 * Defaults for the log forms. Times are typed in the farm's clock, whatever the phone's own zone is set
 * to: a contractor's phone from another state still books rain to the farm's day.
 */

/** "YYYY-MM-DDTHH:mm" (a datetime-local value) for `at` on the farm's clock. */
export function farmClockInput(timeZone: string, at: Date = new Date()): string {
  return format(new TZDate(at.getTime(), timeZone), "yyyy-MM-dd'T'HH:mm");
}

/** "YYYY-MM-DD" for `at` on the farm's clock. */
export function farmDateInput(timeZone: string, at: Date = new Date()): string {
  return format(new TZDate(at.getTime(), timeZone), "yyyy-MM-dd");
}

/** A datetime-local value read on the farm's clock, as an ISO instant with the farm's offset; null when malformed. */
export function farmClockToInstant(value: string, timeZone: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(value);
  if (!m) return null;
  const [, y, mo, d, h, mi] = m.map(Number) as [number, number, number, number, number, number];
  return formatISO(new TZDate(y, mo - 1, d, h, mi, 0, timeZone));
}

/** Great-circle distance in km (haversine, mean Earth radius 6371 km: common practice, no source). */
export function distanceKm(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const rad = Math.PI / 180;
  const dLat = (lat2 - lat1) * rad;
  const dLon = (lon2 - lon1) * rad;
  const a = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * rad) * Math.cos(lat2 * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371 * Math.asin(Math.min(1, Math.sqrt(a)));
}

/** The located item nearest to a position, or undefined when none has a location. */
export function nearest<T extends { latitude: number | null; longitude: number | null }>(items: T[], lat: number, lon: number): T | undefined {
  let best: { item: T; km: number } | undefined;
  for (const item of items) {
    if (item.latitude === null || item.longitude === null) continue;
    const km = distanceKm(lat, lon, item.latitude, item.longitude);
    if (!best || km < best.km) best = { item, km };
  }
  return best?.item;
}
