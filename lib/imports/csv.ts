/**
 * Reading CSV files for imports: rows keep their line numbers so the report can point at them, columns
 * are found by their header name, and local timestamps are read in the farm's time zone.
 */
import Papa from "papaparse";
import { TZDate } from "@date-fns/tz";
import { AppError } from "@/lib/api/errors";

export const DATE_ORDERS = ["ymd", "dmy", "mdy"] as const;
export type DateOrder = (typeof DATE_ORDERS)[number];

export interface CsvRow {
  /** 1-based line in the file (one record per line; quoted line breaks are not expected here) */
  line: number;
  cells: string[];
}

export interface CsvTable {
  header: string[];
  rows: CsvRow[];
}

/** Splits a CSV text into its header and data rows; the delimiter (comma, semicolon, tab) is detected. */
export function readCsv(text: string): CsvTable {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { header: false, skipEmptyLines: false });
  const all = parsed.data.map((cells, i) => ({ line: i + 1, cells }));
  const nonEmpty = all.filter((r) => r.cells.some((c) => c.trim() !== ""));
  const [head, ...rows] = nonEmpty;
  if (!head) throw new AppError("invalid", "The file is empty.", { file: "No rows" });
  return { header: head.cells.map((c) => c.trim()), rows };
}

/**
 * The index of each mapped column in the header, matched without regard to case or surrounding spaces.
 * A mapping that names a column the file lacks is refused before anything is read.
 */
export function mapColumns<K extends string>(
  header: string[],
  mapping: Partial<Record<K, string>>,
): Partial<Record<K, number>> {
  const lower = header.map((h) => h.toLowerCase());
  const found: Partial<Record<K, number>> = {};
  const missing: Record<string, string> = {};
  for (const [key, name] of Object.entries(mapping) as [K, string | undefined][]) {
    if (name === undefined) continue;
    const index = lower.indexOf(name.trim().toLowerCase());
    if (index < 0)
      missing[`options.columns.${key}`] = `The file has no column "${name}" (it has: ${header.join(", ")})`;
    else found[key] = index;
  }
  if (Object.keys(missing).length > 0)
    throw new AppError("invalid", "The column mapping does not match the file.", missing);
  return found;
}

/** A cell's text, or undefined for an empty or unmapped cell. */
export function cell(row: CsvRow, index: number | undefined): string | undefined {
  if (index === undefined) return undefined;
  const value = row.cells[index]?.trim();
  return value === undefined || value === "" ? undefined : value;
}

/** A finite number, or null when it is not one ('12.5', '-3', '1e-2'; not '12,5' or 'n/a'). */
export function parseNumber(text: string): number | null {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text)) return null;
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}

export interface ParsedStamp {
  date: string;
  hasTime: boolean;
  hour: number;
  minute: number;
  second: number;
  /** milliseconds within the second (loggers write tips to the millisecond) */
  ms: number;
  /** minutes east of UTC when the text carries an offset or Z; null for local time */
  offsetMin: number | null;
}

const DATE_PATTERNS: Record<DateOrder, RegExp> = {
  ymd: /^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})/,
  dmy: /^(\d{1,2})[-/.](\d{1,2})[-/.](\d{4})/,
  mdy: /^(\d{1,2})[-/.](\d{1,2})[-/.](\d{4})/,
};
const TIME_PATTERN = /^(?:[T ]+)(\d{1,2}):(\d{2})(?::(\d{2})(\.\d+)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i;

function validDate(y: number, m: number, d: number): boolean {
  const t = new Date(Date.UTC(y, m - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
}

/** Reads '2026-11-30', '30/11/2026 14:05', '2026-11-30T14:05:00+10:00' …; null when it is not a date. */
export function parseStamp(text: string, order: DateOrder): ParsedStamp | null {
  const m = DATE_PATTERNS[order].exec(text);
  if (!m) return null;
  const [a, b, c] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const [y, mo, d] = order === "ymd" ? [a, b, c] : order === "dmy" ? [c, b, a] : [c, a, b];
  if (!validDate(y, mo, d)) return null;
  const date = `${String(y).padStart(4, "0")}-${String(mo).padStart(2, "0")}-${String(d).padStart(2, "0")}`;
  const rest = text.slice(m[0].length);
  if (rest.trim() === "")
    return { date, hasTime: false, hour: 0, minute: 0, second: 0, ms: 0, offsetMin: null };
  const t = TIME_PATTERN.exec(rest);
  if (!t) return null;
  const [hour, minute, second] = [Number(t[1]), Number(t[2]), Number(t[3] ?? 0)];
  // 24:00 is the end of the day in some loggers' output; anything else past 23:59:59 is a typo.
  if (hour > 24 || minute > 59 || second > 59 || (hour === 24 && (minute > 0 || second > 0))) return null;
  const ms = t[4] ? Math.round(Number(`0${t[4]}`) * 1000) : 0;
  let offsetMin: number | null = null;
  if (t[5]) {
    if (t[5].toUpperCase() === "Z") offsetMin = 0;
    else {
      const digits = t[5].replace(":", "");
      const sign = digits.startsWith("-") ? -1 : 1;
      offsetMin = sign * (Number(digits.slice(1, 3)) * 60 + Number(digits.slice(3, 5)));
    }
  }
  return { date, hasTime: true, hour, minute, second, ms, offsetMin };
}

/** The UTC instant (epoch ms) of a stamp; local stamps are read in the farm's time zone. */
export function stampToEpochMs(stamp: ParsedStamp, timeZone: string): number {
  const [y, mo, d] = stamp.date.split("-").map(Number) as [number, number, number];
  if (stamp.offsetMin !== null) {
    return (
      Date.UTC(y, mo - 1, d, stamp.hour, stamp.minute, stamp.second, stamp.ms) - stamp.offsetMin * 60_000
    );
  }
  // TZDate rolls 24:00 over to the next day's midnight, as the stamp means.
  return new TZDate(y, mo - 1, d, stamp.hour, stamp.minute, stamp.second, stamp.ms, timeZone).getTime();
}

/** The local calendar date of an instant in a time zone. */
export function localDate(epochMs: number, timeZone: string): string {
  const t = new TZDate(epochMs, timeZone);
  return `${String(t.getFullYear()).padStart(4, "0")}-${String(t.getMonth() + 1).padStart(2, "0")}-${String(t.getDate()).padStart(2, "0")}`;
}

/** Length of a local calendar day in ms: 23 or 25 hours on the days clocks change. */
export function localDayLengthMs(date: string, timeZone: string): number {
  const [y, m, d] = date.split("-").map(Number) as [number, number, number];
  return new TZDate(y, m - 1, d + 1, timeZone).getTime() - new TZDate(y, m - 1, d, timeZone).getTime();
}

/** Told the share of a file's rows read so far (0-1); awaited, so a large file's progress is stored as it goes. */
export type ReadProgress = (share: number) => Promise<void>;

const PACE_ROWS = 2000;

/** The rows, pausing every few thousand to report progress (and to let other requests run). */
export async function* paced<T>(rows: readonly T[], progress?: ReadProgress): AsyncGenerator<T> {
  for (let i = 0; i < rows.length; i++) {
    if (progress && i > 0 && i % PACE_ROWS === 0) await progress(i / rows.length);
    yield rows[i] as T;
  }
}
