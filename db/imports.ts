import "server-only";
import type { Knex } from "knex";
import type { ImportCounts, ImportReport } from "@/lib/imports/report";
import type { ImportKind } from "@/lib/imports/options";
import { audit } from "./audit";
import { db } from "./knex";

export type ImportStatus = "processing" | "done" | "rejected" | "failed";

export interface ImportRecord {
  id: string;
  farmId: string;
  kind: ImportKind;
  fileName: string;
  sizeBytes: number;
  fileHash: string;
  options: unknown;
  status: ImportStatus;
  progress: number;
  counts: ImportCounts;
  report: ImportReport | null;
  createdBy: string | null;
  createdAt: string;
  finishedAt: string | null;
}

interface ImportRow {
  id: string;
  farm_id: string;
  kind: ImportKind;
  file_name: string;
  size_bytes: string | number;
  file_hash: string;
  fingerprint: string;
  options: unknown;
  status: ImportStatus;
  progress: number;
  total_rows: number;
  accepted_rows: number;
  rejected_rows: number;
  inserted: number;
  updated: number;
  unchanged: number;
  report: ImportReport | null;
  created_by: string | null;
  created_at: Date;
  finished_at: Date | null;
}

export function toImport(r: ImportRow): ImportRecord {
  return {
    id: r.id,
    farmId: r.farm_id,
    kind: r.kind,
    fileName: r.file_name,
    sizeBytes: Number(r.size_bytes),
    fileHash: r.file_hash,
    options: r.options,
    status: r.status,
    progress: r.progress,
    counts: {
      rows: r.total_rows,
      accepted: r.accepted_rows,
      rejected: r.rejected_rows,
      inserted: r.inserted,
      updated: r.updated,
      unchanged: r.unchanged,
    },
    report: r.report,
    createdBy: r.created_by,
    createdAt: r.created_at.toISOString(),
    finishedAt: r.finished_at ? r.finished_at.toISOString() : null,
  };
}

export interface NewImport {
  farmId: string;
  kind: ImportKind;
  fileName: string;
  sizeBytes: number;
  fileHash: string;
  fingerprint: string;
  options: unknown;
  userId: string;
}

/**
 * Starts an import, or finds the one already made (or under way) from the same file with the same
 * options on this farm: the partial unique index decides, so two uploads at once cannot both start.
 */
export async function startImport(n: NewImport): Promise<{ record: ImportRecord; repeat: boolean }> {
  const [row] = (await db("imports")
    .insert({
      farm_id: n.farmId,
      kind: n.kind,
      file_name: n.fileName,
      size_bytes: n.sizeBytes,
      file_hash: n.fileHash,
      fingerprint: n.fingerprint,
      options: JSON.stringify(n.options),
      created_by: n.userId,
    })
    .onConflict(db.raw("(farm_id, fingerprint) where status in ('processing', 'done')"))
    .ignore()
    .returning("*")) as ImportRow[];
  if (row) return { record: toImport(row), repeat: false };
  const existing = (await db("imports")
    .where({ farm_id: n.farmId, fingerprint: n.fingerprint })
    .whereIn("status", ["processing", "done"])
    .first()) as ImportRow | undefined;
  if (!existing) throw new Error("import vanished between insert and select");
  return { record: toImport(existing), repeat: true };
}

/** Records progress (0-1) outside the import's own transaction, so readers see it as it moves. */
export async function setImportProgress(id: string, progress: number): Promise<void> {
  await db("imports")
    .where({ id, status: "processing" })
    .update({ progress: Math.min(1, Math.max(0, progress)) });
}

export async function finishImport(
  trx: Knex | Knex.Transaction,
  id: string,
  status: Exclude<ImportStatus, "processing">,
  counts: ImportCounts,
  report: ImportReport,
): Promise<void> {
  await trx("imports")
    .where({ id })
    .update({
      status,
      progress: 1,
      total_rows: counts.rows,
      accepted_rows: counts.accepted,
      rejected_rows: counts.rejected,
      inserted: counts.inserted,
      updated: counts.updated,
      unchanged: counts.unchanged,
      report: JSON.stringify(report),
      finished_at: trx.fn.now(),
    });
}

/**
 * Stores what a committed import wrote while it is still running its checks; the import is "done" only
 * when finishImport says so afterwards.
 */
export async function recordWritten(
  trx: Knex.Transaction,
  id: string,
  counts: ImportCounts,
  report: ImportReport,
  progress: number,
): Promise<void> {
  await trx("imports")
    .where({ id })
    .update({
      progress,
      total_rows: counts.rows,
      accepted_rows: counts.accepted,
      rejected_rows: counts.rejected,
      inserted: counts.inserted,
      updated: counts.updated,
      unchanged: counts.unchanged,
      report: JSON.stringify(report),
    });
}

export async function getImport(farmId: string, id: string): Promise<ImportRecord | undefined> {
  const row = (await db("imports").where({ farm_id: farmId, id }).first()) as ImportRow | undefined;
  return row ? toImport(row) : undefined;
}

/** An import by id alone, for the worker that runs it (the job carries no farm). */
export async function getImportById(id: string): Promise<ImportRecord | undefined> {
  const row = (await db("imports").where({ id }).first()) as ImportRow | undefined;
  return row ? toImport(row) : undefined;
}

export async function listImports(
  farmId: string,
  page: { limit: number; offset: number },
): Promise<{ rows: ImportRecord[]; total: number }> {
  const rows = (await db("imports")
    .where({ farm_id: farmId })
    .orderBy([
      { column: "created_at", order: "desc" },
      { column: "id", order: "desc" },
    ])
    .limit(page.limit)
    .offset(page.offset)) as ImportRow[];
  const [count] = (await db("imports").where({ farm_id: farmId }).count<{ n: string }[]>({ n: "*" })) as {
    n: string;
  }[];
  return { rows: rows.map(toImport), total: Number(count?.n ?? 0) };
}

export interface FarmForImport {
  timeZone: string;
  boundaryHour: number;
}

export async function farmForImport(farmId: string): Promise<FarmForImport> {
  const row = (await db("farms").where({ id: farmId }).first("time_zone", "rain_day_boundary_hour")) as
    { time_zone: string; rain_day_boundary_hour: number } | undefined;
  if (!row) throw new Error(`farm ${farmId} not found`);
  return { timeZone: row.time_zone, boundaryHour: row.rain_day_boundary_hour };
}

/** A live station of the farm; another farm's station is as absent as one that does not exist. */
export async function stationOfFarm(farmId: string, stationId: string): Promise<{ id: string } | undefined> {
  return (await db("weather_stations")
    .where({ farm_id: farmId, id: stationId })
    .whereNull("archived_at")
    .first("id")) as { id: string } | undefined;
}

export async function gaugeOfFarm(
  farmId: string,
  gaugeId: string,
): Promise<{ id: string; kind: "manual" | "recording"; resolutionMm: number | null } | undefined> {
  const row = (await db("gauges")
    .where({ farm_id: farmId, id: gaugeId })
    .whereNull("archived_at")
    .first("id", "kind", "resolution_mm")) as
    { id: string; kind: "manual" | "recording"; resolution_mm: number | null } | undefined;
  return row ? { id: row.id, kind: row.kind, resolutionMm: row.resolution_mm } : undefined;
}

/** The first planting date among some fields: a field's area matters to its account from then on. */
export async function earliestPlanting(
  trx: Knex.Transaction,
  fieldIds: readonly string[],
): Promise<string | null> {
  if (fieldIds.length === 0) return null;
  const row = (await trx("plantings")
    .whereIn("field_id", fieldIds)
    .min<{ first: string | null }>({ first: "planting_date" })
    .first()) as { first: string | null } | undefined;
  return row?.first ?? null;
}

export async function gaugesOfFarm(farmId: string): Promise<{ id: string; name: string }[]> {
  return (await db("gauges").where({ farm_id: farmId }).whereNull("archived_at").select("id", "name")) as {
    id: string;
    name: string;
  }[];
}

export async function fieldsOfFarm(farmId: string): Promise<{ id: string; name: string }[]> {
  return (await db("fields").where({ farm_id: farmId }).whereNull("archived_at").select("id", "name")) as {
    id: string;
    name: string;
  }[];
}

type Cell = string | number | boolean | Date | object | null;
type Row = Record<string, Cell>;

/** JSON with object keys sorted, so jsonb (which reorders keys) compares equal to what was sent. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(",")}]`;
  if (value && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(",")}}`;
  }
  return JSON.stringify(value);
}

function same(a: Cell | undefined, b: Cell | undefined): boolean {
  if (a instanceof Date || b instanceof Date)
    return new Date(a as Date).getTime() === new Date(b as Date).getTime();
  if (typeof a === "object" && a !== null && typeof b === "object" && b !== null)
    return canonical(a) === canonical(b);
  if (a instanceof Date || b instanceof Date)
    return new Date(a as Date).getTime() === new Date(b as Date).getTime();
  if (typeof a === "number" && typeof b === "number")
    return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a));
  return (a ?? null) === (b ?? null);
}

export interface UpsertSpec {
  table: string;
  /** columns that identify a row within `scope` (with the scope, a unique key of the table) */
  keys: string[];
  /** columns whose values the file supplies; a row whose values all match is left alone */
  values: string[];
  /** extra conditions every existing row must meet (e.g. kind = 'observed') */
  scope?: Record<string, Cell>;
  /** columns set on insert only (created_by) and on update only (updated_by) */
  onInsert?: Row;
  onUpdate?: Row;
  audit: { farmId: string; userId: string; entity: string; reason: string };
}

const CHUNK = 250;

/**
 * Writes rows so that a file imported twice changes nothing: rows whose key exists with the same values
 * are counted unchanged (not even updated_at moves), changed ones are updated and audited with their
 * before and after, and new ones inserted. `progress` hears the share done after every chunk.
 */
export async function upsertUnchanged(
  trx: Knex.Transaction,
  spec: UpsertSpec,
  rows: Row[],
  progress: (done: number) => Promise<void> = async () => undefined,
): Promise<{ inserted: number; updated: number; unchanged: number; insertedIds: string[] }> {
  const result = { inserted: 0, updated: 0, unchanged: 0, insertedIds: [] as string[] };
  const keyOf = (r: Row) =>
    spec.keys.map((k) => (r[k] instanceof Date ? (r[k] as Date).getTime() : String(r[k]))).join("|");
  const keyed = (c: Cell | undefined) => (c === undefined ? null : c);
  for (let start = 0; start < rows.length; start += CHUNK) {
    const chunk = rows.slice(start, start + CHUNK);
    const query = trx(spec.table).where(spec.scope ?? {});
    // One key column is a plain `in` list the index answers at once; a list of row values costs the
    // planner an index probe per row to plan, which is slow for hundreds of rows.
    const [only] = spec.keys;
    if (spec.keys.length === 1 && only) {
      query.whereIn(only, chunk.map((r) => keyed(r[only])) as (string | number | Date | null)[]);
    } else {
      query.whereIn(
        spec.keys,
        chunk.map((r) => spec.keys.map((k) => keyed(r[k])) as (string | number | Date | null)[]),
      );
    }
    const existing = (await query.select("*")) as Row[];
    const byKey = new Map(existing.map((r) => [keyOf(r), r]));
    const inserts: Row[] = [];
    for (const row of chunk) {
      const old = byKey.get(keyOf(row));
      if (!old) {
        inserts.push({ ...row, ...spec.onInsert });
      } else if (spec.values.every((c) => same(old[c], row[c]))) {
        result.unchanged += 1;
      } else {
        const change = Object.fromEntries(spec.values.map((c) => [c, row[c] ?? null]));
        await trx(spec.table)
          .where({ id: old.id })
          .update({ ...change, ...spec.onUpdate });
        const before = Object.fromEntries(spec.values.map((c) => [c, old[c] ?? null]));
        await auditRow(trx, spec, String(old.id), before, change);
        result.updated += 1;
      }
    }
    if (inserts.length > 0) {
      const ids = (await trx(spec.table).insert(inserts).returning("id")) as { id: string | number }[];
      result.inserted += ids.length;
      result.insertedIds.push(...ids.map((r) => String(r.id)));
    }
    await progress(Math.min(1, (start + chunk.length) / rows.length));
  }
  return result;
}

async function auditRow(
  trx: Knex.Transaction,
  spec: UpsertSpec,
  entityId: string,
  before: Row,
  after: Row,
): Promise<void> {
  await audit({ ...spec.audit, action: "update", entityId, before, after }, trx);
}
