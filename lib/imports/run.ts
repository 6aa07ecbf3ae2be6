import "server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { audit } from "@/db/audit";
import { db } from "@/db/knex";
import {
  farmForImport, fieldsOfFarm, finishImport, gaugeOfFarm, gaugesOfFarm, getImport, setImportProgress, startImport, stationOfFarm,
  upsertUnchanged, type ImportRecord,
} from "@/db/imports";
import { WEATHER_VALUE_COLUMNS, weatherColumns } from "@/db/forecast";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { runFarmQc } from "@/lib/qc/run";
import { addDaysIso } from "@/lib/waterbalance";
import { parseBoundaries } from "./boundaries";
import { localDate, readCsv } from "./csv";
import type { ImportRequest } from "./options";
import { parseGaugeReadings, parseRainLogger } from "./rain";
import type { ImportCounts, ImportReport, ProblemList } from "./report";
import { parseWeather } from "./weather";

/** Files above this are refused with 413 before they are read. */
export const MAX_IMPORT_BYTES = 20 * 1024 * 1024;
/** Files up to this are processed within the request; larger ones in the background, with progress. */
export const SYNC_IMPORT_BYTES = 256 * 1024;

/** Reading takes the first 40 % of an import's progress, writing the next 55 %, QC the rest. */
const READ_SHARE = 0.4;
const WRITE_SHARE = 0.55;

interface Job {
  importId: string;
  farmId: string;
  userId: string;
  fileName: string;
  bytes: Uint8Array;
  request: ImportRequest;
}

/** What the parsing step hands to the writing step. */
interface Prepared {
  rows: number;
  problems: ProblemList;
  warnings: string[];
  unit: "line" | "feature";
  /** writes the accepted rows inside the transaction; returns counts, the first and last date, fields touched */
  write: (trx: Knex.Transaction, progress: (share: number) => Promise<void>) => Promise<{ inserted: number; updated: number; unchanged: number; from?: string; to?: string; fieldIds?: string[] }>;
  accepted: number;
}

/** Checks that the station or gauge the options name belongs to the farm (422 naming the option if not). */
async function checkReferences(farmId: string, request: ImportRequest): Promise<void> {
  if (request.kind === "weather_csv" && !(await stationOfFarm(farmId, request.options.stationId))) {
    throw new AppError("invalid", "That weather station is not one of this farm's.", { "options.stationId": "No such station on this farm" });
  }
  if (request.kind === "rain_csv") {
    const gauge = await gaugeOfFarm(farmId, request.options.gaugeId);
    if (!gauge) throw new AppError("invalid", "That gauge is not one of this farm's.", { "options.gaugeId": "No such gauge on this farm" });
    if (request.options.mode === "tips" && request.options.tipMm === undefined && gauge.resolutionMm === null) {
      throw new AppError("invalid", "The gauge has no bucket size; say how deep one tip is.", { "options.tipMm": "Required for this gauge" });
    }
  }
}

/**
 * Starts an import: a repeat of a finished one (same file, kind and options on this farm) returns that
 * import; a small file is processed before answering; a large one is processed after the answer while
 * its progress is written to its row.
 */
export async function startFileImport(args: Omit<Job, "importId">): Promise<{ record: ImportRecord; repeat: boolean; background: boolean }> {
  await checkReferences(args.farmId, args.request);
  const fileHash = createHash("sha256").update(args.bytes).digest("hex");
  const fingerprint = createHash("sha256").update(fileHash).update(args.request.kind).update(JSON.stringify(args.request.options)).digest("hex");
  const { record, repeat } = await startImport({
    farmId: args.farmId, kind: args.request.kind, fileName: args.fileName, sizeBytes: args.bytes.byteLength,
    fileHash, fingerprint, options: args.request.options, userId: args.userId,
  });
  if (repeat) return { record, repeat, background: false };
  const job: Job = { ...args, importId: record.id };
  if (args.bytes.byteLength <= SYNC_IMPORT_BYTES) {
    await processImport(job);
    return { record: (await getImport(args.farmId, record.id)) ?? record, repeat: false, background: false };
  }
  void processImport(job);
  return { record, repeat: false, background: true };
}

/** Parses, writes and checks one import, recording the outcome on its row whatever happens. */
export async function processImport(job: Job): Promise<void> {
  try {
    const prepared = await prepare(job);
    await setImportProgress(job.importId, READ_SHARE);
    const counts: ImportCounts = { rows: prepared.rows, accepted: prepared.accepted, rejected: prepared.problems.rejectedLines, inserted: 0, updated: 0, unchanged: 0 };
    const report: ImportReport = { unit: prepared.unit, rejected: prepared.problems.items, warnings: prepared.warnings, written: false };
    const writeGood = job.request.options.writeGoodRows;
    if (prepared.problems.total > 0 && !writeGood) {
      await finishImport(db, job.importId, "rejected", counts, report);
      return;
    }
    const written = await db.transaction(async (trx) => {
      const result = await prepared.write(trx, (share) => setImportProgress(job.importId, READ_SHARE + WRITE_SHARE * share));
      Object.assign(counts, { inserted: result.inserted, updated: result.updated, unchanged: result.unchanged });
      report.written = true;
      if (result.from && result.to) report.dateRange = { from: result.from, to: result.to };
      const changed = result.inserted + result.updated > 0;
      if (changed && result.fieldIds) await markFieldsDirty(trx, { fieldIds: result.fieldIds }, result.from ?? localDate(Date.now(), "UTC"));
      else if (changed && result.from) await markFieldsDirty(trx, { farmId: job.farmId }, result.from);
      await audit(
        { farmId: job.farmId, userId: job.userId, action: "import", entity: "import", entityId: job.importId, after: { kind: job.request.kind, fileName: job.fileName, counts, dateRange: report.dateRange ?? null } },
        trx,
      );
      await finishImport(trx, job.importId, "done", counts, report);
      return { changed, from: result.from, to: result.to };
    });
    if (written.from && written.to && job.request.kind !== "boundaries") {
      const qc = await runFarmQc(job.farmId, written.from, written.to);
      report.qc = { flagsOpened: qc.opened };
      await db("imports").where({ id: job.importId }).update({ report: JSON.stringify(report) });
    }
    if (written.changed) await requestRecompute(job.farmId);
  } catch (err) {
    const appError = err instanceof AppError ? err : null;
    if (!appError) console.error("import failed", job.importId, err);
    const report: ImportReport = {
      unit: "line", rejected: [], written: false,
      warnings: [appError ? `${appError.message}${appError.fields ? ` ${JSON.stringify(appError.fields)}` : ""}` : "The import stopped on an unexpected error; nothing was written."],
    };
    await finishImport(db, job.importId, "failed", { rows: 0, accepted: 0, rejected: 0, inserted: 0, updated: 0, unchanged: 0 }, report);
    if (appError && job.bytes.byteLength <= SYNC_IMPORT_BYTES) throw appError;
  }
}

function span(dates: string[]): { from?: string; to?: string } {
  if (dates.length === 0) return {};
  const sorted = [...dates].sort();
  return { from: sorted[0], to: sorted[sorted.length - 1] };
}

async function prepare(job: Job): Promise<Prepared> {
  const { request, farmId, userId } = job;
  const reading = (share: number) => setImportProgress(job.importId, READ_SHARE * share);
  const auditCtx = { farmId, userId, reason: `import ${job.importId}` };
  if (request.kind === "boundaries") {
    const parsed = await parseBoundaries(job.fileName, job.bytes, request.options);
    const fields = new Map((await fieldsOfFarm(farmId)).map((f) => [f.name.trim().toLowerCase(), f]));
    const rows = parsed.boundaries.filter((b) => {
      if (request.options.createMissing || fields.has(b.name.toLowerCase())) return true;
      parsed.problems.add({ line: b.line, column: request.options.nameProperty, value: b.name, reason: "no field of this farm has this name" });
      return false;
    });
    return {
      rows: parsed.rows, problems: parsed.problems, warnings: [], unit: "feature", accepted: rows.length,
      write: async (trx, progress) => {
        const r = await upsertUnchanged(
          trx,
          { table: "fields", keys: ["farm_id", "name"], scope: { archived_at: null }, values: ["boundary", "area_ha", "centroid_lat", "centroid_lon"], onInsert: { created_by: userId, updated_by: userId }, onUpdate: { updated_by: userId }, audit: { ...auditCtx, entity: "field" } },
          rows.map((b) => ({ farm_id: farmId, name: fields.get(b.name.toLowerCase())?.name ?? b.name, boundary: b.boundary, area_ha: b.areaHa, centroid_lat: b.centroidLat, centroid_lon: b.centroidLon })),
          progress,
        );
        const names = rows.map((b) => fields.get(b.name.toLowerCase())?.id).filter((id): id is string => Boolean(id));
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
      rows: parsed.rows, problems: parsed.problems, warnings: parsed.warnings, unit: "line", accepted: parsed.days.length,
      write: async (trx, progress) => {
        const r = await upsertUnchanged(
          trx,
          { table: "weather_days", keys: ["station_id", "date", "kind"], values: WEATHER_VALUE_COLUMNS, onInsert: { created_by: userId, source: "import" }, onUpdate: { updated_by: userId, source: "import" }, audit: { ...auditCtx, entity: "weather_day" } },
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
      rows: parsed.rows, problems: parsed.problems, warnings: parsed.warnings, unit: "line", accepted: parsed.records.length,
      write: async (trx, progress) => {
        const r = await upsertUnchanged(
          trx,
          { table: "rain_records", keys: ["gauge_id", "at"], values: ["depth_mm", "interval_s"], onInsert: { created_by: userId }, audit: { ...auditCtx, entity: "rain_record" } },
          parsed.records.map((x) => ({ gauge_id: request.options.gaugeId, at: new Date(x.atMs), depth_mm: x.depthMm, interval_s: x.intervalS })),
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
    rows: parsed.rows, problems: parsed.problems, warnings: [], unit: "line", accepted: parsed.readings.length,
    write: async (trx, progress) => {
      const r = await upsertUnchanged(
        trx,
        { table: "rain_readings", keys: ["gauge_id", "rain_date"], values: ["depth_mm", "read_at"], onInsert: { created_by: userId, updated_by: userId }, onUpdate: { updated_by: userId }, audit: { ...auditCtx, entity: "rain_reading" } },
        parsed.readings.map((x) => ({ gauge_id: x.gaugeId, rain_date: x.rainDate, read_at: new Date(x.readAtMs), depth_mm: x.depthMm })),
        progress,
      );
      return { ...r, ...span(parsed.readings.map((x) => x.rainDate)) };
    },
  };
}
