/**
 * Weather station files to daily weather: daily files row by row, hourly (or sub-hourly) files
 * aggregated to the farm's local calendar days as FAO-56 ch. 3 builds daily inputs: Tmax and Tmin are
 * the day's extremes, RHmax and RHmin the extremes of humidity, wind the mean, solar radiation and rain
 * the sums over the day.
 */
import {
  cell,
  mapColumns,
  parseNumber,
  parseStamp,
  stampToEpochMs,
  localDate,
  localDayLengthMs,
  paced,
  type CsvTable,
  type ReadProgress,
  type CsvRow,
} from "./csv";
import type { WeatherOptions } from "./options";
import { ProblemList } from "./report";
import { toCelsius, toMetresPerSecond, toMillimetres, toSolarMJm2 } from "./units";

export interface WeatherDayInput {
  date: string;
  tmaxC: number | null;
  tminC: number | null;
  rhMaxPct: number | null;
  rhMinPct: number | null;
  rhMeanPct: number | null;
  windMs: number | null;
  solarMJm2: number | null;
  rainMm: number | null;
}

export interface WeatherParse {
  days: WeatherDayInput[];
  problems: ProblemList;
  warnings: string[];
  rows: number;
}

type Column = keyof WeatherOptions["columns"];
type Value = Exclude<Column, "date">;

/** Physical limits a value must meet to be stored at all (the weather_days CHECKs); QC judges the rest. */
const LIMITS: Record<Value, [number, number]> = {
  tmax: [-90, 60],
  tmin: [-90, 60],
  temp: [-90, 60],
  rhMax: [0, 100],
  rhMin: [0, 100],
  rh: [0, 100],
  wind: [0, 60],
  solar: [0, 50],
  rain: [0, 1000],
};

/** A converted value of one row, or undefined (empty cell), after reporting a bad cell. */
function readValue(
  row: CsvRow,
  key: Value,
  index: number | undefined,
  header: string[],
  problems: ProblemList,
  convert: (v: number) => number,
  limits: [number, number] = LIMITS[key],
): number | undefined {
  const text = cell(row, index);
  if (text === undefined || index === undefined) return undefined;
  const column = header[index] ?? key;
  const raw = parseNumber(text);
  if (raw === null) {
    problems.add({ line: row.line, column, value: text, reason: "not a number" });
    return undefined;
  }
  const value = convert(raw);
  if (value < limits[0] || value > limits[1]) {
    problems.add({
      line: row.line,
      column,
      value: text,
      reason: `outside ${limits[0]}…${limits[1]} after conversion (${round(value)})`,
    });
    return undefined;
  }
  return value;
}

function round(v: number): number {
  return Math.round(v * 1000) / 1000;
}

function converters(o: WeatherOptions, periodS: number): Record<Value, (v: number) => number> {
  const t = (v: number) => toCelsius(v, o.units.temperature);
  const same = (v: number) => v;
  return {
    tmax: t,
    tmin: t,
    temp: t,
    rhMax: same,
    rhMin: same,
    rh: same,
    wind: (v) => toMetresPerSecond(v, o.units.wind),
    solar: (v) => toSolarMJm2(v, o.units.solar, periodS),
    rain: (v) => toMillimetres(v, o.units.rain),
  };
}

const VALUES: Value[] = ["tmax", "tmin", "temp", "rhMax", "rhMin", "rh", "wind", "solar", "rain"];

function readRowValues(
  row: CsvRow,
  idx: Partial<Record<Column, number>>,
  header: string[],
  problems: ProblemList,
  conv: Record<Value, (v: number) => number>,
) {
  const values: Partial<Record<Value, number>> = {};
  for (const key of VALUES) {
    const v = readValue(row, key, idx[key], header, problems, conv[key]);
    if (v !== undefined) values[key] = v;
  }
  return values;
}

/** Reads a weather file; `timeZone` is the farm's, for local time stamps of sub-daily files. */
export async function parseWeather(
  table: CsvTable,
  o: WeatherOptions,
  timeZone: string,
  progress?: ReadProgress,
): Promise<WeatherParse> {
  const idx = mapColumns<Column>(table.header, o.columns);
  return o.interval === "daily"
    ? parseDaily(table, o, idx, progress)
    : parseHourly(table, o, idx, timeZone, progress);
}

async function parseDaily(
  table: CsvTable,
  o: WeatherOptions,
  idx: Partial<Record<Column, number>>,
  progress?: ReadProgress,
): Promise<WeatherParse> {
  const problems = new ProblemList();
  const conv = converters(o, 86_400);
  const seen = new Map<string, number>();
  const days: WeatherDayInput[] = [];
  const dateColumn = table.header[idx.date ?? 0] ?? "date";
  for await (const row of paced(table.rows, progress)) {
    const text = cell(row, idx.date);
    const stamp = text === undefined ? null : parseStamp(text, o.dateOrder);
    if (!stamp) {
      problems.add({
        line: row.line,
        column: dateColumn,
        value: text ?? "",
        reason: text === undefined ? "missing date" : `not a date in ${o.dateOrder} order`,
      });
      continue;
    }
    const v = readRowValues(row, idx, table.header, problems, conv);
    const tmax = v.tmax ?? null;
    const tmin = v.tmin ?? null;
    if (tmax !== null && tmin !== null && tmax < tmin) {
      problems.add({
        line: row.line,
        column: table.header[idx.tmin ?? 0] ?? "tmin",
        reason: "minimum temperature above the maximum",
      });
    }
    const rhMax = v.rhMax ?? null;
    const rhMin = v.rhMin ?? null;
    if (rhMax !== null && rhMin !== null && rhMin > rhMax) {
      problems.add({
        line: row.line,
        column: table.header[idx.rhMin ?? 0] ?? "rhMin",
        reason: "minimum humidity above the maximum",
      });
    }
    const earlier = seen.get(stamp.date);
    if (earlier !== undefined) {
      problems.add({
        line: row.line,
        column: dateColumn,
        value: text,
        reason: `the same date as line ${earlier}`,
      });
    }
    if (problems.has(row.line)) continue;
    seen.set(stamp.date, row.line);
    days.push({
      date: stamp.date,
      tmaxC: tmax,
      tminC: tmin,
      rhMaxPct: rhMax,
      rhMinPct: rhMin,
      rhMeanPct: v.rh ?? null,
      windMs: v.wind ?? null,
      solarMJm2: v.solar ?? null,
      rainMm: v.rain ?? null,
    });
  }
  return {
    days: days.sort((a, b) => a.date.localeCompare(b.date)),
    problems,
    warnings: [],
    rows: table.rows.length,
  };
}

interface DayBucket {
  count: number;
  temps: number[];
  rhs: number[];
  winds: number[];
  solar: number[];
  rain: number[];
}

function aggregate(date: string, b: DayBucket): WeatherDayInput {
  const max = (xs: number[]) => (xs.length ? Math.max(...xs) : null);
  const min = (xs: number[]) => (xs.length ? Math.min(...xs) : null);
  const mean = (xs: number[]) => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : null);
  // A sum is only a day's total when every interval reported; otherwise it is left missing.
  const sum = (xs: number[]) => (xs.length === b.count ? xs.reduce((s, x) => s + x, 0) : null);
  return {
    date,
    tmaxC: max(b.temps),
    tminC: min(b.temps),
    rhMaxPct: max(b.rhs),
    rhMinPct: min(b.rhs),
    rhMeanPct: mean(b.rhs),
    windMs: mean(b.winds),
    solarMJm2: sum(b.solar),
    rainMm: sum(b.rain),
  };
}

async function parseHourly(
  table: CsvTable,
  o: WeatherOptions,
  idx: Partial<Record<Column, number>>,
  timeZone: string,
  progress?: ReadProgress,
): Promise<WeatherParse> {
  const problems = new ProblemList();
  const periodMs = o.intervalMinutes * 60_000;
  const conv = converters(o, periodMs / 1000);
  const seen = new Map<number, number>();
  const buckets = new Map<string, DayBucket>();
  const dateColumn = table.header[idx.date ?? 0] ?? "date";
  for await (const row of paced(table.rows, progress)) {
    const text = cell(row, idx.date);
    const stamp = text === undefined ? null : parseStamp(text, o.dateOrder);
    if (!stamp || !stamp.hasTime) {
      problems.add({
        line: row.line,
        column: dateColumn,
        value: text ?? "",
        reason: text === undefined ? "missing time stamp" : "not a date and time",
      });
      continue;
    }
    const atMs = stampToEpochMs(stamp, timeZone);
    const earlier = seen.get(atMs);
    if (earlier !== undefined)
      problems.add({
        line: row.line,
        column: dateColumn,
        value: text,
        reason: `the same time as line ${earlier}`,
      });
    const v = readRowValues(row, idx, table.header, problems, conv);
    if (problems.has(row.line)) continue;
    seen.set(atMs, row.line);
    // The interval's middle decides its day, so an interval ending at 00:00 belongs to the day before.
    const midMs = o.stampMarks === "end" ? atMs - periodMs / 2 : atMs + periodMs / 2;
    const date = localDate(midMs, timeZone);
    const b = buckets.get(date) ?? { count: 0, temps: [], rhs: [], winds: [], solar: [], rain: [] };
    b.count += 1;
    for (const t of [v.temp, v.tmax, v.tmin]) if (t !== undefined) b.temps.push(t);
    for (const h of [v.rh, v.rhMax, v.rhMin]) if (h !== undefined) b.rhs.push(h);
    if (v.wind !== undefined) b.winds.push(v.wind);
    if (v.solar !== undefined) b.solar.push(v.solar);
    if (v.rain !== undefined) b.rain.push(v.rain);
    buckets.set(date, b);
  }
  const warnings: string[] = [];
  const days: WeatherDayInput[] = [];
  for (const [date, b] of [...buckets.entries()].sort(([a], [c]) => a.localeCompare(c))) {
    const expected = Math.round(localDayLengthMs(date, timeZone) / periodMs);
    // A day's extremes and sums need the whole day; a part day (often the first and last) is left out.
    if (b.count < expected) {
      warnings.push(`${date}: ${b.count} of ${expected} intervals, not written`);
      continue;
    }
    const day = aggregate(date, b);
    if (o.columns.solar && day.solarMJm2 === null)
      warnings.push(`${date}: solar radiation missing in some intervals, left empty`);
    if (o.columns.rain && day.rainMm === null)
      warnings.push(`${date}: rain missing in some intervals, left empty`);
    days.push(day);
  }
  return { days, problems, warnings, rows: table.rows.length };
}
