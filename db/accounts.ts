import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";

/** The stored water account (account_days): bulk rewrites by the recompute job, and the reads of the API. */

/** Rows for account_days in columns, as the bulk insert takes them. */
export interface AccountColumns {
  fieldId: string[];
  date: string[];
  plantingId: string[];
  etoMm: number[];
  kc: number[];
  etcMm: number[];
  ks: number[];
  etActualMm: number[];
  rainMm: number[];
  runoffMm: number[];
  effectiveRainMm: number[];
  irrigationGrossMm: number[];
  irrigationNetMm: number[];
  capillaryRiseMm: number[];
  deepPercolationMm: number[];
  depletionStartMm: number[];
  depletionEndMm: number[];
  tawMm: number[];
  rawMm: number[];
  pAdjusted: number[];
  rootDepthM: number[];
  soilCheckReset: boolean[];
  /** 1-based index into provenanceTexts: most days of a batch share their provenance */
  provenanceIndex: number[];
  provenanceTexts: string[];
}

/** `'…'` SQL string literal (standard_conforming_strings is on, the PostgreSQL default, so only quotes double). */
function sqlText(s: string): string {
  return `'${s.replace(/'/g, "''")}'`;
}

/** Array literal of uuids, dates, numbers or booleans (values Rootbank generated; none needs quoting). */
function plainArray(values: readonly (string | number | boolean)[], type: string): string {
  return `'{${values.join(",")}}'::${type}[]`;
}

/** Array literal of arbitrary texts: each element in double quotes with backslashes and quotes escaped. */
function textArray(values: readonly string[]): string {
  let s = "{";
  for (let i = 0; i < values.length; i++) {
    if (i > 0) s += ",";
    s += `"${values[i]!.replace(/\\/g, "\\\\").replace(/"/g, '\\"')}"`;
  }
  return `${sqlText(s + "}")}::text[]`;
}

/**
 * The driver's error quotes the whole statement (megabytes of literals here); keep PostgreSQL's own
 * message, code and constraint only.
 */
function shortError(err: unknown): unknown {
  if (!(err instanceof Error)) return err;
  const pg = err as Error & { code?: string; constraint?: string; detail?: string };
  const reason = pg.message.includes(" - ") ? pg.message.slice(pg.message.lastIndexOf(" - ") + 3) : pg.message;
  return Object.assign(new Error(`rewriting account days: ${reason}`), { code: pg.code, constraint: pg.constraint, detail: pg.detail });
}

const FLOAT_COLUMNS = [
  ["eto_mm", "etoMm"],
  ["kc", "kc"],
  ["etc_mm", "etcMm"],
  ["ks", "ks"],
  ["et_actual_mm", "etActualMm"],
  ["rain_mm", "rainMm"],
  ["runoff_mm", "runoffMm"],
  ["effective_rain_mm", "effectiveRainMm"],
  ["irrigation_gross_mm", "irrigationGrossMm"],
  ["irrigation_net_mm", "irrigationNetMm"],
  ["capillary_rise_mm", "capillaryRiseMm"],
  ["deep_percolation_mm", "deepPercolationMm"],
  ["depletion_start_mm", "depletionStartMm"],
  ["depletion_end_mm", "depletionEndMm"],
  ["taw_mm", "tawMm"],
  ["raw_mm", "rawMm"],
  ["p_adjusted", "pAdjusted"],
  ["root_depth_m", "rootDepthM"],
] as const satisfies readonly (readonly [string, keyof AccountColumns])[];

/**
 * Rewrites fields' account days in one round trip: deletes each field's days from its date on, inserts
 * `rows` (provenance parsed once per distinct text), and clears the marks whose counter is unchanged
 * (compare-and-set). The statements go as one simple query, which PostgreSQL runs as one implicit
 * transaction, so the server works while the caller computes the next batch. Returns the ids cleared.
 */
export async function rewriteAccountDays(
  deleteFrom: readonly { fieldId: string; fromDate: string }[],
  rows: AccountColumns,
  marks: readonly { fieldId: string; seq: number }[],
  conn: Knex = db,
): Promise<string[]> {
  const statements: string[] = [];
  if (deleteFrom.length > 0) {
    statements.push(
      `delete from account_days a using unnest(${plainArray(deleteFrom.map((d) => d.fieldId), "uuid")}, ${plainArray(deleteFrom.map((d) => d.fromDate), "date")}) ` +
        "as v(field_id, from_date) where a.field_id = v.field_id and a.date >= v.from_date",
    );
  }
  if (rows.fieldId.length > 0) {
    const names = FLOAT_COLUMNS.map(([c]) => c).join(", ");
    statements.push(
      `insert into account_days (field_id, date, planting_id, ${names}, soil_check_reset, provenance) ` +
        `select v.field_id, v.date, v.planting_id, ${FLOAT_COLUMNS.map(([c]) => `v.${c}`).join(", ")}, v.soil_check_reset, p.doc ` +
        `from unnest(${plainArray(rows.fieldId, "uuid")}, ${plainArray(rows.date, "date")}, ${plainArray(rows.plantingId, "uuid")}, ` +
        `${FLOAT_COLUMNS.map(([, key]) => plainArray(rows[key] as number[], "float8")).join(", ")}, ` +
        `${plainArray(rows.soilCheckReset.map((b) => (b ? "t" : "f")), "boolean")}, ${plainArray(rows.provenanceIndex, "int")}) ` +
        `as v(field_id, date, planting_id, ${names}, soil_check_reset, provenance_index) ` +
        `join (select ord::int as idx, t.doc::jsonb as doc from unnest(${textArray(rows.provenanceTexts)}) with ordinality as t(doc, ord)) p ` +
        "on p.idx = v.provenance_index",
    );
  }
  if (marks.length > 0) {
    statements.push(
      `update fields f set account_dirty_from = null from unnest(${plainArray(marks.map((m) => m.fieldId), "uuid")}, ` +
        `${plainArray(marks.map((m) => m.seq), "bigint")}) as v(id, seq) where f.id = v.id and f.account_dirty_seq = v.seq returning f.id`,
    );
  }
  if (statements.length === 0) return [];
  let res: { rows?: { id: string }[] } | { rows?: { id: string }[] }[];
  try {
    res = (await conn.raw(statements.join(";\n"))) as typeof res;
  } catch (err) {
    throw shortError(err);
  }
  const last = Array.isArray(res) ? res[res.length - 1] : res;
  return marks.length > 0 ? (last?.rows ?? []).map((r) => r.id) : [];
}

/**
 * Clears the dirty mark of fields whose mark was not touched since it was read (compare-and-set on the
 * counter every marking bumps). Returns the ids cleared; the others stay dirty for the next run.
 */
export async function clearDirtyMarks(trx: Knex | Knex.Transaction, marks: readonly { fieldId: string; seq: number }[]): Promise<string[]> {
  if (marks.length === 0) return [];
  const res = await trx.raw<{ rows: { id: string }[] }>(
    "update fields f set account_dirty_from = null from unnest(?::uuid[], ?::bigint[]) as v(id, seq) " +
      "where f.id = v.id and f.account_dirty_seq = v.seq returning f.id",
    [`{${marks.map((m) => m.fieldId).join(",")}}`, `{${marks.map((m) => m.seq).join(",")}}`],
  );
  return res.rows.map((r) => r.id);
}

/** The stored day before each field's rewrite: where its depletion is carried in from. */
export async function carriedDepletions(
  conn: Knex | Knex.Transaction,
  wanted: readonly { fieldId: string; date: string }[],
): Promise<Map<string, { depletionEndMm: number; plantingId: string | null }>> {
  const out = new Map<string, { depletionEndMm: number; plantingId: string | null }>();
  if (wanted.length === 0) return out;
  const res = await conn.raw<{ rows: { field_id: string; depletion_end_mm: number; planting_id: string | null }[] }>(
    "select a.field_id, a.depletion_end_mm, a.planting_id from account_days a " +
      "join unnest(?::uuid[], ?::date[]) as v(field_id, date) on a.field_id = v.field_id and a.date = v.date",
    [`{${wanted.map((w) => w.fieldId).join(",")}}`, `{${wanted.map((w) => w.date).join(",")}}`],
  );
  for (const r of res.rows) out.set(r.field_id, { depletionEndMm: Number(r.depletion_end_mm), plantingId: r.planting_id });
  return out;
}

/** One stored day of a field's account, as the API shows it. */
export interface StoredAccountDay {
  date: string;
  plantingId: string | null;
  etoMm: number | null;
  kc: number | null;
  etcMm: number | null;
  ks: number | null;
  etActualMm: number | null;
  rainMm: number | null;
  runoffMm: number | null;
  effectiveRainMm: number | null;
  irrigationGrossMm: number | null;
  irrigationNetMm: number | null;
  capillaryRiseMm: number | null;
  deepPercolationMm: number | null;
  depletionStartMm: number;
  depletionEndMm: number;
  tawMm: number | null;
  rawMm: number | null;
  pAdjusted: number | null;
  rootDepthM: number | null;
  soilCheckReset: boolean;
  provenance: Record<string, unknown>;
  computedAt: string;
}

type Row = Record<string, unknown>;
const n = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

export function toStoredAccountDay(r: Row): StoredAccountDay {
  return {
    date: String(r.date),
    plantingId: (r.planting_id as string | null) ?? null,
    etoMm: n(r.eto_mm),
    kc: n(r.kc),
    etcMm: n(r.etc_mm),
    ks: n(r.ks),
    etActualMm: n(r.et_actual_mm),
    rainMm: n(r.rain_mm),
    runoffMm: n(r.runoff_mm),
    effectiveRainMm: n(r.effective_rain_mm),
    irrigationGrossMm: n(r.irrigation_gross_mm),
    irrigationNetMm: n(r.irrigation_net_mm),
    capillaryRiseMm: n(r.capillary_rise_mm),
    deepPercolationMm: n(r.deep_percolation_mm),
    depletionStartMm: Number(r.depletion_start_mm),
    depletionEndMm: Number(r.depletion_end_mm),
    tawMm: n(r.taw_mm),
    rawMm: n(r.raw_mm),
    pAdjusted: n(r.p_adjusted),
    rootDepthM: n(r.root_depth_m),
    soilCheckReset: Boolean(r.soil_check_reset),
    provenance: (r.provenance as Record<string, unknown>) ?? {},
    computedAt: r.computed_at instanceof Date ? r.computed_at.toISOString() : String(r.computed_at),
  };
}

/** A field's account days from `from` to `to`, oldest first. */
export async function listAccountDays(fieldId: string, from: string, to: string, conn: Knex = db): Promise<StoredAccountDay[]> {
  const rows = (await conn("account_days").where("field_id", fieldId).whereBetween("date", [from, to]).orderBy("date")) as Row[];
  return rows.map(toStoredAccountDay);
}

/** The latest stored days of a field (newest first). */
export async function latestAccountDays(fieldId: string, limit: number, conn: Knex = db): Promise<StoredAccountDay[]> {
  const rows = (await conn("account_days").where("field_id", fieldId).orderBy("date", "desc").limit(limit)) as Row[];
  return rows.map(toStoredAccountDay);
}

/** The latest stored day and the recent mean ETo of each of a farm's fields, for outlooks and the plan. */
export async function latestDaysOfFarm(
  farmId: string,
  recentDays: number,
  conn: Knex = db,
): Promise<Map<string, { date: string; depletionEndMm: number; plantingId: string | null; recentEtoMm: number[] }>> {
  const res = await conn.raw<{ rows: { field_id: string; date: string; depletion_end_mm: number; planting_id: string | null; recent: number[] }[] }>(
    `select f.id as field_id, a.date, a.depletion_end_mm, a.planting_id, r.recent
       from fields f
       join lateral (select date, depletion_end_mm, planting_id from account_days where field_id = f.id order by date desc limit 1) a on true
       join lateral (select array_agg(eto_mm order by date) as recent from account_days
                      where field_id = f.id and date > a.date - ?::int and eto_mm is not null) r on true
      where f.farm_id = ? and f.archived_at is null`,
    [recentDays, farmId],
  );
  const out = new Map<string, { date: string; depletionEndMm: number; plantingId: string | null; recentEtoMm: number[] }>();
  for (const r of res.rows) {
    out.set(r.field_id, {
      date: String(r.date),
      depletionEndMm: Number(r.depletion_end_mm),
      plantingId: r.planting_id,
      recentEtoMm: (r.recent ?? []).map(Number),
    });
  }
  return out;
}

/** One field on the farm map. */
export interface FieldStatusRow {
  id: string;
  name: string;
  dirtyFrom: string | null;
  lastDate: string | null;
  depletionMm: number | null;
  tawMm: number | null;
  rawMm: number | null;
  mad: number | null;
  /** mean crop ET of the last seven stored days, mm/day */
  recentEtcMm: number | null;
}

/**
 * Every live field of a farm with its latest stored day and the mean crop ET of its last seven stored
 * days, in one statement: one backward scan of seven entries per field on the account's primary key.
 */
export async function farmStatusRows(farmId: string, conn: Knex = db): Promise<FieldStatusRow[]> {
  const res = await conn.raw<{ rows: Row[] }>(
    `select f.id, f.name, f.account_dirty_from, a.date, a.depletion_end_mm, a.taw_mm, a.raw_mm, p.mad, a.etc
       from fields f
       left join lateral (
         select max(w.date) as date, (array_agg(w.depletion_end_mm order by w.date desc))[1] as depletion_end_mm,
                (array_agg(w.taw_mm order by w.date desc))[1] as taw_mm, (array_agg(w.raw_mm order by w.date desc))[1] as raw_mm,
                (array_agg(w.planting_id order by w.date desc))[1] as planting_id, avg(w.etc_mm) as etc
           from (select date, depletion_end_mm, taw_mm, raw_mm, planting_id, etc_mm from account_days
                  where field_id = f.id order by date desc limit 7) w
       ) a on true
       left join plantings p on p.id = a.planting_id
      where f.farm_id = ? and f.archived_at is null
      order by f.name`,
    [farmId],
  );
  return res.rows.map((r) => ({
    id: String(r.id),
    name: String(r.name),
    dirtyFrom: (r.account_dirty_from as string | null) ?? null,
    lastDate: (r.date as string | null) ?? null,
    depletionMm: n(r.depletion_end_mm),
    tawMm: n(r.taw_mm),
    rawMm: n(r.raw_mm),
    mad: n(r.mad),
    recentEtcMm: n(r.etc),
  }));
}
