import "server-only";
import { createHash } from "node:crypto";
import { audit } from "@/db/audit";
import { db } from "@/db/knex";
import {
  earliestPlanting,
  finishImport,
  gaugeOfFarm,
  getImport,
  recordWritten,
  setImportProgress,
  startImport,
  stationOfFarm,
  type ImportRecord,
} from "@/db/imports";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { queueImport } from "./background";
import { runFarmQc } from "@/lib/qc/run";
import type { ImportRequest } from "./options";
import { prepare, READ_SHARE, WRITE_SHARE, type Job } from "./prepare";
import type { ImportCounts, ImportReport } from "./report";

/** Files above this are refused with 413 before they are read. */
export const MAX_IMPORT_BYTES = 20 * 1024 * 1024;
/** Files up to this are processed within the request; larger ones by a worker (./background.ts), with progress. */
export const SYNC_IMPORT_BYTES = 256 * 1024;

/** Checks that the station or gauge the options name belongs to the farm (422 naming the option if not). */
async function checkReferences(farmId: string, request: ImportRequest): Promise<void> {
  if (request.kind === "weather_csv" && !(await stationOfFarm(farmId, request.options.stationId))) {
    throw new AppError("invalid", "That weather station is not one of this farm's.", {
      "options.stationId": "No such station on this farm",
    });
  }
  if (request.kind === "rain_csv") {
    const gauge = await gaugeOfFarm(farmId, request.options.gaugeId);
    if (!gauge)
      throw new AppError("invalid", "That gauge is not one of this farm's.", {
        "options.gaugeId": "No such gauge on this farm",
      });
    if (gauge.kind !== "recording") {
      throw new AppError(
        "invalid",
        "A manual gauge has readings, not logger records; import them as gauge readings.",
        {
          "options.gaugeId": "Not a recording gauge",
        },
      );
    }
    if (
      request.options.mode === "tips" &&
      request.options.tipMm === undefined &&
      gauge.resolutionMm === null
    ) {
      throw new AppError("invalid", "The gauge has no bucket size; say how deep one tip is.", {
        "options.tipMm": "Required for this gauge",
      });
    }
  }
}

/**
 * Starts an import: a repeat of a finished one (same file, kind and options on this farm) returns that
 * import; a small file is processed before answering; a large one is queued for a worker, which writes
 * its progress to its row.
 */
export async function startFileImport(
  args: Omit<Job, "importId">,
): Promise<{ record: ImportRecord; repeat: boolean; background: boolean }> {
  await checkReferences(args.farmId, args.request);
  const fileHash = createHash("sha256").update(args.bytes).digest("hex");
  const fingerprint = createHash("sha256")
    .update(fileHash)
    .update(args.request.kind)
    .update(JSON.stringify(args.request.options))
    .digest("hex");
  const { record, repeat } = await startImport({
    farmId: args.farmId,
    kind: args.request.kind,
    fileName: args.fileName,
    sizeBytes: args.bytes.byteLength,
    fileHash,
    fingerprint,
    options: args.request.options,
    userId: args.userId,
  });
  if (repeat) return { record, repeat, background: false };
  const job: Job = { ...args, importId: record.id };
  if (args.bytes.byteLength <= SYNC_IMPORT_BYTES) {
    await processImport(job);
    return { record: (await getImport(args.farmId, record.id)) ?? record, repeat: false, background: false };
  }
  await queueImport(args.farmId, record.id, args.bytes);
  return { record, repeat: false, background: true };
}

/** Parses, writes and checks one import, recording the outcome on its row whatever happens. */
export async function processImport(job: Job): Promise<void> {
  try {
    const prepared = await prepare(job);
    await setImportProgress(job.importId, READ_SHARE);
    const counts: ImportCounts = {
      rows: prepared.rows,
      accepted: prepared.rows - prepared.problems.rejectedLines,
      rejected: prepared.problems.rejectedLines,
      inserted: 0,
      updated: 0,
      unchanged: 0,
    };
    const report: ImportReport = {
      unit: prepared.unit,
      rejected: prepared.problems.items,
      warnings: prepared.warnings,
      written: false,
    };
    const writeGood = job.request.options.writeGoodRows;
    if (prepared.problems.total > 0 && !writeGood) {
      await finishImport(db, job.importId, "rejected", counts, report);
      return;
    }
    const written = await db.transaction(async (trx) => {
      const result = await prepared.write(trx, (share) =>
        setImportProgress(job.importId, READ_SHARE + WRITE_SHARE * share),
      );
      Object.assign(counts, {
        inserted: result.inserted,
        updated: result.updated,
        unchanged: result.unchanged,
      });
      report.written = true;
      if (result.from && result.to) report.dateRange = { from: result.from, to: result.to };
      const changed = result.inserted + result.updated > 0;
      if (changed && result.fieldIds) {
        // A new boundary changes the field's area, and with it every volume turned into a depth.
        const from = await earliestPlanting(trx, result.fieldIds);
        if (from) await markFieldsDirty(trx, { fieldIds: result.fieldIds }, from);
      } else if (changed && result.from) await markFieldsDirty(trx, { farmId: job.farmId }, result.from);
      await audit(
        {
          farmId: job.farmId,
          userId: job.userId,
          action: "import",
          entity: "import",
          entityId: job.importId,
          after: {
            kind: job.request.kind,
            fileName: job.fileName,
            counts,
            dateRange: report.dateRange ?? null,
          },
        },
        trx,
      );
      await recordWritten(trx, job.importId, counts, report, READ_SHARE + WRITE_SHARE);
      return { changed, from: result.from, to: result.to };
    });
    await afterCommit(job, counts, report, written);
  } catch (err) {
    const appError = err instanceof AppError ? err : null;
    if (!appError) console.error("import failed", job.importId, err);
    const report: ImportReport = {
      unit: "line",
      rejected: [],
      written: false,
      warnings: [
        appError
          ? `${appError.message}${appError.fields ? ` ${JSON.stringify(appError.fields)}` : ""}`
          : "The import stopped on an unexpected error; nothing was written.",
      ],
    };
    await finishImport(
      db,
      job.importId,
      "failed",
      { rows: 0, accepted: 0, rejected: 0, inserted: 0, updated: 0, unchanged: 0 },
      report,
    );
    if (appError && job.bytes.byteLength <= SYNC_IMPORT_BYTES) throw appError;
  }
}

/**
 * Quality control over the dates written, then a recompute, then the import is done. The rows are
 * committed by now, so a failure here is a warning on the import, not a failed import.
 */
async function afterCommit(
  job: Job,
  counts: ImportCounts,
  report: ImportReport,
  written: { changed: boolean; from?: string; to?: string },
): Promise<void> {
  try {
    if (written.from && written.to && job.request.kind !== "boundaries") {
      const qc = await runFarmQc(job.farmId, written.from, written.to);
      report.qc = { flagsOpened: qc.opened };
    }
    if (written.changed) await requestRecompute(job.farmId);
  } catch (err) {
    console.error("after import", job.importId, err);
    report.warnings.push(
      "The rows were written, but quality control or the account update could not start; they will run with the next recompute.",
    );
  }
  await finishImport(db, job.importId, "done", counts, report).catch((err: unknown) =>
    console.error("after import", job.importId, err),
  );
}
