/**
 * Display units and farm-local dates for screens. Values travel through the API in SI-style units with
 * the unit in the name (`depthMm`, `areaHa`, `volumeM3`); only what a person reads is converted here.
 * Pure and client-safe: no server imports.
 */

export type UnitSystem = "metric" | "imperial";

/** 1 inch = 25.4 mm exactly (international yard and pound agreement, 1959). */
export const MM_PER_INCH = 25.4;
/** 1 international acre = 4,046.8564224 m² exactly = 0.40468564224 ha. */
export const HA_PER_ACRE = 0.40468564224;
/** 1 acre-foot ≈ 1,233.48 m³ (43,560 ft³ × 0.3048³ m³/ft³). */
export const M3_PER_ACRE_FOOT = 1233.48;
/** 1 ML = 1,000 m³. */
export const M3_PER_ML = 1000;
/** 1 mm of water over 1 ha = 10 m³ (0.001 m × 10,000 m²); so 100 mm over 1 ha = 1 ML. */
export const M3_PER_MM_HA = 10;
/** 1 US gallon = 3.785411784 L exactly. */
export const LITRES_PER_US_GALLON = 3.785411784;

export const mmToInches = (mm: number): number => mm / MM_PER_INCH;
export const inchesToMm = (inches: number): number => inches * MM_PER_INCH;
export const haToAcres = (ha: number): number => ha / HA_PER_ACRE;
export const m3ToAcreFeet = (m3: number): number => m3 / M3_PER_ACRE_FOOT;
export const m3ToMl = (m3: number): number => m3 / M3_PER_ML;
export const celsiusToFahrenheit = (c: number): number => (c * 9) / 5 + 32;
/** m³/h to US gallons per minute. */
export const m3hToGpm = (m3h: number): number => (m3h * 1000) / LITRES_PER_US_GALLON / 60;

function fixed(value: number, digits: number): string {
  // Avoid "-0" after rounding a tiny negative.
  const s = value.toLocaleString("en", { minimumFractionDigits: digits, maximumFractionDigits: digits });
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s;
}

/** The depth unit's symbol. */
export function depthUnit(system: UnitSystem): "mm" | "in" {
  return system === "imperial" ? "in" : "mm";
}

/** A depth in the person's unit, as a number (for charts). */
export function depthValue(mm: number, system: UnitSystem): number {
  return system === "imperial" ? mmToInches(mm) : mm;
}

/** "12 mm" or "0.47 in"; `digits` is for millimetres, inches get two more. */
export function formatDepth(mm: number | null | undefined, system: UnitSystem, digits = 0): string {
  if (mm === null || mm === undefined || !Number.isFinite(mm)) return "—";
  return system === "imperial" ? `${fixed(mmToInches(mm), digits + 2)} in` : `${fixed(mm, digits)} mm`;
}

/** "12.3 ha" or "30.4 ac". */
export function formatArea(ha: number | null | undefined, system: UnitSystem, digits = 1): string {
  if (ha === null || ha === undefined || !Number.isFinite(ha)) return "—";
  return system === "imperial" ? `${fixed(haToAcres(ha), digits)} ac` : `${fixed(ha, digits)} ha`;
}

/** Metric: m³ below 10,000 m³, ML above; imperial: acre-feet. */
export function formatVolume(m3: number | null | undefined, system: UnitSystem): string {
  if (m3 === null || m3 === undefined || !Number.isFinite(m3)) return "—";
  if (system === "imperial") return `${fixed(m3ToAcreFeet(m3), 2)} ac-ft`;
  return Math.abs(m3) < 10_000 ? `${fixed(m3, 0)} m³` : `${fixed(m3ToMl(m3), 1)} ML`;
}

/** "24.5 °C" or "76.1 °F". */
export function formatTemperature(c: number | null | undefined, system: UnitSystem, digits = 1): string {
  if (c === null || c === undefined || !Number.isFinite(c)) return "—";
  return system === "imperial" ? `${fixed(celsiusToFahrenheit(c), digits)} °F` : `${fixed(c, digits)} °C`;
}

/** "150 m³/h" or "660 gal/min" (US gallons). */
export function formatFlow(m3h: number | null | undefined, system: UnitSystem): string {
  if (m3h === null || m3h === undefined || !Number.isFinite(m3h)) return "—";
  return system === "imperial" ? `${fixed(m3hToGpm(m3h), 0)} gal/min` : `${fixed(m3h, 0)} m³/h`;
}

/** "7 h 30 min" from fractional hours, to the nearest 5 minutes (a run time is set on a dial, not a stopwatch). */
export function formatHours(hours: number | null | undefined): string {
  if (hours === null || hours === undefined || !Number.isFinite(hours) || hours < 0) return "—";
  const total = Math.round((hours * 60) / 5) * 5;
  const h = Math.floor(total / 60);
  const m = total % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}

const WEEKDAYS = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"] as const;
const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

/**
 * An ISO local date ('2026-12-02') as it reads on screen, e.g. "Wed 2 Dec"; the date is already the
 * farm's. Built by hand rather than through Intl so server and browser render the same text.
 */
export function formatLocalDate(isoDate: string, style: "short" | "long" = "short"): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  if (Number.isNaN(d.getTime())) return isoDate;
  const s = `${WEEKDAYS[d.getUTCDay()]} ${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
  return style === "long" ? `${s} ${d.getUTCFullYear()}` : s;
}

/** An instant shown in the farm's time zone, e.g. "2 Dec, 09:00". */
export function formatInstant(isoInstant: string, timeZone: string): string {
  const d = new Date(isoInstant);
  if (Number.isNaN(d.getTime())) return isoInstant;
  return d.toLocaleString("en-AU", { timeZone, day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", hour12: false });
}

/** Whole days from one ISO local date to another (positive when `to` is later). */
export function daysFromTo(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

/** "today", "tomorrow", "in 3 days", "2 days ago". */
export function relativeDay(isoDate: string, today: string): string {
  const n = daysFromTo(today, isoDate);
  if (n === 0) return "today";
  if (n === 1) return "tomorrow";
  if (n === -1) return "yesterday";
  return n > 0 ? `in ${n} days` : `${-n} days ago`;
}
