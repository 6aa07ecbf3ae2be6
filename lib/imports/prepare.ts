import "server-only";
import type { Knex } from "knex";
import {
  fieldsOfFarm,
  farmForImport,
  gaugeOfFarm,
  gaugesOfFarm,
  setImportProgress,
  upsertUnchanged,
} from "@/db/imports";
import { WEATHER_VALUE_COLUMNS, weatherColumns } from "@/db/forecast";
import { addDaysIso } from "@/lib/waterbalance";
import { parseBoundaries } from "./boundaries";
import { localDate, readCsv } from "./csv";
import type { ImportRequest } from "./options";
import { parseGaugeReadings, parseRainLogger } from "./rain";
import type { ProblemList } from "./report";
import { parseWeather } from "./weather";

/** Reading takes the first 40 % of an import's progress, writing the next 55 %, QC the rest. */
export const READ_SHARE = 0.4;
export const WRITE_SHARE = 0.55;

export interface Job {
  importId: string;
  farmId: string;
  userId: string;
  fileName: string;
  bytes: Uint8Array;
  request: ImportRequest;
}

/** What the parsing step hands to the writing step. */
export interface Prepared {
  rows: number;
  problems: ProblemList;
  warnings: string[];
  unit: "line" | "feature";
  /** writes the accepted rows inside the transaction; returns counts, the first and last date, fields touched */
  write: (
    trx: Knex.Transaction,
    progress: (share: number) => Promise<void>,
  ) => Promise<{
    inserted: number;
    updated: number;
    unchanged: number;
    from?: string;
    to?: string;
    fieldIds?: string[];
  }>;
}

function span(dates: string[]): { from?: string; to?: string } {
  if (dates.length === 0) return {};
  const sorted = [...dates].sort();
  return { from: sorted[0], to: sorted[sorted.length - 1] };
}

/** Reads a file of any kind into the rows to write and the problems found, without writing anything. */
export async function prepare(job: Job): Promise<Prepared> {
  const { request, farmId, userId } = job;
  const reading = (share: number) => setImportProgress(job.importId, READ_SHARE * share);
  const auditCtx = { farmId, userId, reason: `import ${job.importId}` };
  if (request.kind === "boundaries") {
    const parsed = await parseBoundaries(job.fileName, job.bytes, request.options);
    const fields = new Map((await fieldsOfFarm(farmId)).map((f) => [f.name.trim().toLowerCase(), f]));
    const rows = parsed.boundaries.filter((b) => {
      if (request.options.createMissing || fields.has(b.name.toLowerCase())) return true;
      parsed.problems.add({
        line: b.line,
        column: request.options.nameProperty,
        value: b.name,
        reason: "no field of this farm has this name",
      });
      return false;
    });
    return {
      rows: parsed.rows,
      problems: parsed.problems,
      warnings: [],
      unit: "feature",
      write: async (trx, progress) => {
        const r = await upsertUnchanged(
          trx,
          {
            table: "fields",
            keys: ["name"],
            scope: { farm_id: farmId, archived_at: null },
            values: ["boundary", "area_ha", "centroid_lat", "centroid_lon"],
            onInsert: { created_by: userId, updated_by: userId },
            onUpdate: { updated_by: userId },
            audit: { ...auditCtx, entity: "field" },
          },
          rows.map((b) => ({
            farm_id: farmId,
            name: fields.get(b.name.toLowerCase())?.name ?? b.name,
            boundary: b.boundary,
            area_ha: b.areaHa,
            centroid_lat: b.centroidLat,
            centroid_lon: b.centroidLon,
          })),
          progress,
        );
        const names = rows
          .map((b) => fields.get(b.name.toLowerCase())?.id)
          .filter((id): id is string => Boolean(id));
        return { ...r, fieldIds: [...names, ...r.insertedIds] };
      },
    };
  }
  const farm = await farmForImport(farmId);
  const table = readCsv(new TextDecoder().decode(job.bytes));
  if (request.kind === "weather_csv") {
    const parsed = await parseWeather(table, request.options, farm.timeZone, reading);
    const { stationId } = request.options;
    return {
      rows: parsed.rows,
      problems: parsed.problems,
      warnings: parsed.warnings,
      unit: "line",
      write: async (trx, progress) => {
        const r = await upsertUnchanged(
          trx,
          {
            table: "weather_days",
            keys: ["date"],
            scope: { station_id: stationId, kind: "observed" },
            values: WEATHER_VALUE_COLUMNS,
            onInsert: { created_by: userId, source: "import" },
            onUpdate: { updated_by: userId, source: "import" },
            audit: { ...auditCtx, entity: "weather_day" },
          },
          parsed.days.map((d) => ({ ...weatherColumns(d), station_id: stationId, kind: "observed" })),
          progress,
        );
        return { ...r, ...span(parsed.days.map((d) => d.date)) };
      },
    };
  }
  if (request.kind === "rain_csv") {
    const gauge = await gaugeOfFarm(farmId, request.options.gaugeId);
    const tipMm = request.options.tipMm ?? gauge?.resolutionMm ?? 0.2;
    const parsed = await parseRainLogger(table, request.options, farm.timeZone, tipMm, reading);
    return {
      rows: parsed.rows,
      problems: parsed.problems,
      warnings: parsed.warnings,
      unit: "line",
      write: async (trx, progress) => {
        const r = await upsertUnchanged(
          trx,
          {
            table: "rain_records",
            keys: ["at"],
            scope: { gauge_id: request.options.gaugeId },
            values: ["depth_mm", "interval_s"],
            onInsert: { created_by: userId },
            audit: { ...auditCtx, entity: "rain_record" },
          },
          parsed.records.map((x) => ({
            gauge_id: request.options.gaugeId,
            at: new Date(x.atMs),
            depth_mm: x.depthMm,
            interval_s: x.intervalS,
          })),
          progress,
        );
        // A record's account day may be the local date before its own (the day ends at the boundary hour).
        const dates = span(parsed.records.map((x) => localDate(x.atMs, farm.timeZone)));
        return { ...r, from: dates.from ? addDaysIso(dates.from, -1) : undefined, to: dates.to };
      },
    };
  }
  const parsed = await parseGaugeReadings(table, request.options, farm, await gaugesOfFarm(farmId), reading);
  return {
    rows: parsed.rows,
    problems: parsed.problems,
    warnings: [],
    unit: "line",
    write: async (trx, progress) => {
      const r = await upsertUnchanged(
        trx,
        {
          table: "rain_readings",
          keys: ["gauge_id", "rain_date"],
          values: ["depth_mm", "read_at"],
          onInsert: { created_by: userId, updated_by: userId },
          onUpdate: { updated_by: userId },
          audit: { ...auditCtx, entity: "rain_reading" },
        },
        parsed.readings.map((x) => ({
          gauge_id: x.gaugeId,
          rain_date: x.rainDate,
          read_at: new Date(x.readAtMs),
          depth_mm: x.depthMm,
        })),
        progress,
      );
      return { ...r, ...span(parsed.readings.map((x) => x.rainDate)) };
    },
  };
}
