/**
 * Rain files: a recording gauge's logger (one row per bucket tip, or one row per interval with its
 * depth) and a backfill of manual gauge readings (gauge, when read, depth).
 */
import { accountDayOfManualReading, accountDayOfReadingDate } from "@/lib/waterbalance";
import {
  cell,
  mapColumns,
  parseNumber,
  parseStamp,
  stampToEpochMs,
  paced,
  type CsvTable,
  type ReadProgress,
} from "./csv";
import type { GaugeReadingsOptions, RainOptions } from "./options";
import { ProblemList } from "./report";
import { toMillimetres } from "./units";

export interface RainRecordInput {
  line: number;
  atMs: number;
  depthMm: number;
  intervalS: number | null;
}

export interface RainParse {
  records: RainRecordInput[];
  problems: ProblemList;
  warnings: string[];
  rows: number;
}

/** Reads a logger file. Tips at the very same instant are kept as one record of their summed depth. */
export async function parseRainLogger(
  table: CsvTable,
  o: RainOptions,
  timeZone: string,
  tipMm: number,
  progress?: ReadProgress,
): Promise<RainParse> {
  const idx = mapColumns<"time" | "depth">(table.header, o.columns);
  const problems = new ProblemList();
  const timeColumn = table.header[idx.time ?? 0] ?? "time";
  const depthColumn = idx.depth === undefined ? "depth" : (table.header[idx.depth] ?? "depth");
  const byInstant = new Map<number, RainRecordInput>();
  // every well-stamped row ends an interval, even one with no rain or a bad depth
  const boundaries: number[] = [];
  let zeroRows = 0;
  let merged = 0;
  for await (const row of paced(table.rows, progress)) {
    const text = cell(row, idx.time);
    const stamp = text === undefined ? null : parseStamp(text, o.dateOrder);
    if (!stamp || !stamp.hasTime) {
      problems.add({
        line: row.line,
        column: timeColumn,
        value: text ?? "",
        reason: text === undefined ? "missing time stamp" : "not a date and time",
      });
      continue;
    }
    const atMs = stampToEpochMs(stamp, timeZone);
    boundaries.push(atMs);
    let depthMm = tipMm;
    if (o.mode === "intervals") {
      const depthText = cell(row, idx.depth);
      const raw = depthText === undefined ? null : parseNumber(depthText);
      if (raw === null || raw < 0) {
        problems.add({
          line: row.line,
          column: depthColumn,
          value: depthText ?? "",
          reason: depthText === undefined ? "missing depth" : "not a depth (a number ≥ 0)",
        });
        continue;
      }
      depthMm = toMillimetres(raw, o.units.rain);
      if (depthMm > 500) {
        problems.add({
          line: row.line,
          column: depthColumn,
          value: depthText,
          reason: "more than 500 mm in one interval",
        });
        continue;
      }
      if (depthMm === 0) {
        zeroRows += 1;
        continue;
      }
    }
    const existing = byInstant.get(atMs);
    if (existing && o.mode === "intervals") {
      problems.add({
        line: row.line,
        column: timeColumn,
        value: text,
        reason: `the same time as line ${existing.line}`,
      });
      continue;
    }
    if (existing) {
      // Two tips stamped alike are a double tip (switch bounce) or a burst; quality control judges which.
      existing.depthMm += depthMm;
      merged += 1;
      continue;
    }
    byInstant.set(atMs, { line: row.line, atMs, depthMm, intervalS: o.intervalS ?? null });
  }
  const records = [...byInstant.values()].sort((a, b) => a.atMs - b.atMs);
  if (o.mode === "intervals" && o.intervalS === undefined) {
    // Without a stated interval, each one runs from the stamp before it (the first one's is unknown).
    const stamps = [...new Set(boundaries)].sort((a, b) => a - b);
    let j = 0;
    for (const r of records) {
      while (j + 1 < stamps.length && (stamps[j + 1] ?? Infinity) < r.atMs) j += 1;
      const before = stamps[j];
      const gapS = before !== undefined && before < r.atMs ? Math.round((r.atMs - before) / 1000) : 0;
      if (gapS > 0 && gapS <= 86_400) r.intervalS = gapS;
    }
  }
  const warnings: string[] = [];
  if (zeroRows > 0) warnings.push(`${zeroRows} intervals with no rain skipped`);
  if (merged > 0)
    warnings.push(`${merged} tips at the same instant as another kept as one record of their summed depth`);
  return { records, problems, warnings, rows: table.rows.length };
}

export interface GaugeRef {
  id: string;
  name: string;
}

export interface ReadingInput {
  line: number;
  gaugeId: string;
  readAtMs: number;
  rainDate: string;
  depthMm: number;
}

/**
 * Reads a backfill of manual readings. A reading with a time is booked to the account day it closes;
 * one with a date only is taken as read at the farm's boundary hour of that date, so it is the day
 * before's rain (the reading-day rule).
 */
export async function parseGaugeReadings(
  table: CsvTable,
  o: GaugeReadingsOptions,
  farm: { timeZone: string; boundaryHour: number },
  gauges: readonly GaugeRef[],
  progress?: ReadProgress,
): Promise<{ readings: ReadingInput[]; problems: ProblemList; rows: number }> {
  const idx = mapColumns<"gauge" | "time" | "depth">(table.header, o.columns);
  const name = (k: "gauge" | "time" | "depth") => table.header[idx[k] ?? 0] ?? k;
  const byKey = new Map(
    gauges.flatMap((g) => [
      [g.id.toLowerCase(), g.id] as const,
      [g.name.trim().toLowerCase(), g.id] as const,
    ]),
  );
  const problems = new ProblemList();
  const seen = new Map<string, number>();
  const readings: ReadingInput[] = [];
  for await (const row of paced(table.rows, progress)) {
    const gaugeText = cell(row, idx.gauge);
    const gaugeId = gaugeText === undefined ? undefined : byKey.get(gaugeText.toLowerCase());
    if (!gaugeId)
      problems.add({
        line: row.line,
        column: name("gauge"),
        value: gaugeText ?? "",
        reason: gaugeText === undefined ? "missing gauge" : "no gauge of this farm has this name or id",
      });
    const timeText = cell(row, idx.time);
    const stamp = timeText === undefined ? null : parseStamp(timeText, o.dateOrder);
    if (!stamp)
      problems.add({
        line: row.line,
        column: name("time"),
        value: timeText ?? "",
        reason: timeText === undefined ? "missing date" : `not a date in ${o.dateOrder} order`,
      });
    const depthText = cell(row, idx.depth);
    const raw = depthText === undefined ? null : parseNumber(depthText);
    const depthMm = raw === null ? null : toMillimetres(raw, o.units.rain);
    if (depthMm === null || depthMm < 0 || depthMm > 1000) {
      problems.add({
        line: row.line,
        column: name("depth"),
        value: depthText ?? "",
        reason: depthText === undefined ? "missing depth" : "not a depth between 0 and 1000 mm",
      });
    }
    if (!gaugeId || !stamp || depthMm === null || problems.has(row.line)) continue;
    const readAtMs = stamp.hasTime
      ? stampToEpochMs(stamp, farm.timeZone)
      : stampToEpochMs({ ...stamp, hour: farm.boundaryHour, hasTime: true }, farm.timeZone);
    const rainDate = stamp.hasTime
      ? accountDayOfManualReading(readAtMs, farm.timeZone, farm.boundaryHour)
      : accountDayOfReadingDate(stamp.date);
    const key = `${gaugeId}|${rainDate}`;
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      problems.add({
        line: row.line,
        column: name("time"),
        value: timeText,
        reason: `a second reading of this gauge for the rain day ${rainDate} (line ${earlier})`,
      });
      continue;
    }
    seen.set(key, row.line);
    readings.push({ line: row.line, gaugeId, readAtMs, rainDate, depthMm });
  }
  return { readings, problems, rows: table.rows.length };
}
