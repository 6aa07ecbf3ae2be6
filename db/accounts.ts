import "server-only";
import { hash } from "node:crypto";
import type { Knex } from "knex";
import type { PoolClient } from "pg";
import { from as copyFrom } from "pg-copy-streams";
import type { AccountDayDto } from "@/lib/accounts/day-types";
import { db } from "./knex";

/** The stored water account (account_days): bulk rewrites by the recompute job, and the reads of the API. */

/**
 * The driver's error quotes the whole statement; keep PostgreSQL's own message, code and constraint only.
 */
function shortError(err: unknown): unknown {
  if (!(err instanceof Error)) return err;
  const pg = err as Error & { code?: string; constraint?: string; detail?: string };
  const reason = pg.message.includes(" - ") ? pg.message.slice(pg.message.lastIndexOf(" - ") + 3) : pg.message;
  return Object.assign(new Error(`rewriting account days: ${reason}`), { code: pg.code, constraint: pg.constraint, detail: pg.detail });
}

/** One run of a field's account (a planting over consecutive days), column by column as the engine gives it. */
export interface AccountDayRun {
  fieldId: string;
  plantingId: string;
  startDate: string;
  days: number;
  etoMm: Float64Array;
  kc: Float64Array;
  etcMm: Float64Array;
  ks: Float64Array;
  etActualMm: Float64Array;
  rainMm: Float64Array;
  runoffMm: Float64Array;
  effectiveRainMm: Float64Array;
  irrigationGrossMm: Float64Array;
  irrigationNetMm: Float64Array;
  capillaryRiseMm: Float64Array;
  deepPercolationMm: Float64Array;
  depletionStartMm: Float64Array;
  depletionEndMm: Float64Array;
  tawMm: Float64Array;
  rawMm: Float64Array;
  pAdjusted: Float64Array;
  rootDepthM: Float64Array;
  /** 1 on a day a soil check reset the account */
  soilCheckReset: Uint8Array;
  /** each day's provenance document: an index from {@link AccountDayRows.addProvenance} */
  provenance: Int32Array;
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
] as const satisfies readonly (readonly [string, keyof AccountDayRun])[];

const COPY_DAYS =
  `copy account_days (field_id, date, planting_id, ${FLOAT_COLUMNS.map(([c]) => c).join(", ")}, soil_check_reset, provenance_id) ` +
  "from stdin with (format binary)";
const COPY_DOCUMENTS = "copy account_provenance (field_id, id, doc) from stdin with (format binary)";

/** Provenance documents in binary COPY format: (field, document id, JSON text) for each pair `k`. */
function documentsCopyData(fieldIds: readonly string[], ids: readonly string[], texts: readonly string[]): Buffer {
  let size = COPY_HEADER.length + COPY_TRAILER_BYTES;
  const lengths = texts.map((t) => Buffer.byteLength(t, "utf8"));
  for (const n of lengths) size += 2 + (4 + 16) * 2 + 4 + n;
  const buf = Buffer.allocUnsafe(size);
  let o = COPY_HEADER.copy(buf, 0);
  for (let k = 0; k < texts.length; k++) {
    o = buf.writeInt16BE(3, o);
    o = buf.writeInt32BE(16, o);
    o += buf.write(fieldIds[k]!.replace(/-/g, ""), o, "hex");
    o = buf.writeInt32BE(16, o);
    o += buf.write(ids[k]!, o, "hex");
    o = buf.writeInt32BE(lengths[k]!, o);
    o += buf.write(texts[k]!, o, "utf8");
  }
  buf.writeInt16BE(-1, o);
  return buf;
}

/** Fields per row of the binary COPY: field, date, planting, the numbers, the reset flag, the provenance. */
const COPY_FIELDS = 3 + FLOAT_COLUMNS.length + 2;
const COPY_ROW_BYTES = 2 + (4 + 16) + (4 + 4) + (4 + 16) + FLOAT_COLUMNS.length * (4 + 8) + (4 + 1) + (4 + 16);
/** "PGCOPY\n\377\r\n\0", then no flags and no header extension (PostgreSQL COPY, binary format). */
const COPY_HEADER = Buffer.concat([Buffer.from("PGCOPY\n\xff\r\n\0", "latin1"), Buffer.alloc(8)]);
const COPY_TRAILER_BYTES = 2;
const COPY_CHUNK = 1 << 20;
/** Days from 1970-01-01 to 2000-01-01, PostgreSQL's date epoch. */
const PG_EPOCH_DAYS = 10957;

/** A uuid as four big-endian 32-bit words. */
function uuidWords(id: string): Int32Array {
  const hex = id.replace(/-/g, "");
  if (!/^[0-9a-fA-F]{32}$/.test(hex)) throw new Error(`not a uuid: ${id}`);
  const out = new Int32Array(4);
  for (let k = 0; k < 4; k++) out[k] = Number.parseInt(hex.slice(8 * k, 8 * k + 8), 16) | 0;
  return out;
}

/**
 * A batch of account_days rows, encoded as they are added in PostgreSQL's binary COPY format (numbers go
 * as IEEE doubles, never through text), with the batch's distinct provenance documents.
 */
export class AccountDayRows {
  /** the batch's distinct provenance documents (JSON texts); rows name them by index */
  readonly provenanceTexts: string[] = [];
  /** md5 of each document's text, as a uuid (32 hex digits): its key in account_provenance */
  readonly provenanceIds: string[] = [];
  private readonly provenanceWords: Int32Array[] = [];
  private readonly runs: { fieldId: string; plantingId: string; firstRow: number; docs: Set<number> }[] = [];
  private readonly uuids = new Map<string, Int32Array>();
  private bytes: Uint8Array;
  private view: DataView;
  private count = 0;

  constructor(expectedRows = 4096) {
    this.bytes = new Uint8Array(COPY_HEADER.length + expectedRows * COPY_ROW_BYTES + COPY_TRAILER_BYTES);
    this.bytes.set(COPY_HEADER, 0);
    this.view = new DataView(this.bytes.buffer);
  }

  /** Rows added so far. */
  get length(): number {
    return this.count;
  }

  /** Empties the batch for reuse (its buffer stays). */
  clear(): void {
    this.provenanceTexts.length = 0;
    this.provenanceIds.length = 0;
    this.provenanceWords.length = 0;
    this.runs.length = 0;
    this.count = 0;
  }

  /** Drops the rows from `length` on (taken from {@link length} between runs). */
  truncate(length: number): void {
    while (this.runs.length > 0 && this.runs[this.runs.length - 1]!.firstRow >= length) this.runs.pop();
    this.count = Math.min(this.count, length);
  }

  /** Adds a provenance document (JSON text) to the batch; returns its index for {@link AccountDayRun.provenance}. */
  addProvenance(json: string): number {
    const id = hash("md5", json);
    this.provenanceTexts.push(json);
    this.provenanceIds.push(id);
    this.provenanceWords.push(uuidWords(id));
    return this.provenanceTexts.length - 1;
  }

  private uuid(id: string): Int32Array {
    let w = this.uuids.get(id);
    if (w === undefined) this.uuids.set(id, (w = uuidWords(id)));
    return w;
  }

  private reserve(rows: number): void {
    const need = COPY_HEADER.length + (this.count + rows) * COPY_ROW_BYTES + COPY_TRAILER_BYTES;
    if (need <= this.bytes.length) return;
    const grown = new Uint8Array(Math.max(need, this.bytes.length * 2));
    grown.set(this.bytes.subarray(0, COPY_HEADER.length + this.count * COPY_ROW_BYTES));
    this.bytes = grown;
    this.view = new DataView(grown.buffer);
  }

  /** Appends a run's days. */
  append(run: AccountDayRun): void {
    const n = run.days;
    if (n <= 0) return;
    this.reserve(n);
    const docs = new Set<number>();
    this.runs.push({ fieldId: run.fieldId, plantingId: run.plantingId, firstRow: this.count, docs });
    const field = this.uuid(run.fieldId);
    const planting = this.uuid(run.plantingId);
    const firstDay = Date.parse(`${run.startDate}T00:00:00Z`) / 86_400_000 - PG_EPOCH_DAYS;
    if (!Number.isInteger(firstDay)) throw new Error(`not an ISO date: ${run.startDate}`);
    const cols = FLOAT_COLUMNS.map(([, key]) => run[key] as Float64Array);
    const v = this.view;
    let o = COPY_HEADER.length + this.count * COPY_ROW_BYTES;
    for (let d = 0; d < n; d++) {
      v.setInt16(o, COPY_FIELDS);
      v.setInt32(o + 2, 16);
      v.setInt32(o + 6, field[0]!);
      v.setInt32(o + 10, field[1]!);
      v.setInt32(o + 14, field[2]!);
      v.setInt32(o + 18, field[3]!);
      v.setInt32(o + 22, 4);
      v.setInt32(o + 26, firstDay + d);
      v.setInt32(o + 30, 16);
      v.setInt32(o + 34, planting[0]!);
      v.setInt32(o + 38, planting[1]!);
      v.setInt32(o + 42, planting[2]!);
      v.setInt32(o + 46, planting[3]!);
      o += 50;
      for (let c = 0; c < cols.length; c++) {
        v.setInt32(o, 8);
        v.setFloat64(o + 4, cols[c]![d]!);
        o += 12;
      }
      v.setInt32(o, 1);
      v.setUint8(o + 4, run.soilCheckReset[d] ? 1 : 0);
      const doc = run.provenance[d]!;
      docs.add(doc);
      const w = this.provenanceWords[doc]!;
      v.setInt32(o + 5, 16);
      v.setInt32(o + 9, w[0]!);
      v.setInt32(o + 13, w[1]!);
      v.setInt32(o + 17, w[2]!);
      v.setInt32(o + 21, w[3]!);
      o += 25;
    }
    this.count += n;
  }

  /** The COPY data: header, rows, trailer. */
  copyData(): Buffer {
    const end = COPY_HEADER.length + this.count * COPY_ROW_BYTES;
    this.view.setInt16(end, -1);
    return Buffer.from(this.bytes.buffer, 0, end + COPY_TRAILER_BYTES);
  }

  /** The fields and plantings of the rows. */
  ids(): { fieldIds: string[]; plantingIds: string[] } {
    return { fieldIds: [...new Set(this.runs.map((r) => r.fieldId))], plantingIds: [...new Set(this.runs.map((r) => r.plantingId))] };
  }

  /** Each field's distinct documents, as (field, document index) pairs. */
  documentsByField(): { fieldIds: string[]; docs: number[] } {
    const byField = new Map<string, Set<number>>();
    for (const r of this.runs) {
      const set = byField.get(r.fieldId);
      if (set) for (const d of r.docs) set.add(d);
      else byField.set(r.fieldId, new Set(r.docs));
    }
    const fieldIds: string[] = [];
    const docs: number[] = [];
    for (const [f, set] of byField) {
      for (const d of set) {
        fieldIds.push(f);
        docs.push(d);
      }
    }
    return { fieldIds, docs };
  }
}

/**
 * COPY FROM STDIN with `data`, written whole at once: the socket then drains it without waiting for the
 * event loop, which is busy computing the next batch.
 */
async function copyIn(client: PoolClient, sql: string, data: Buffer): Promise<void> {
  const stream = client.query(copyFrom(sql));
  await new Promise<void>((resolve, reject) => {
    stream.on("error", reject);
    stream.on("finish", resolve);
    for (let k = 0; k < data.length; k += COPY_CHUNK) stream.write(data.subarray(k, k + COPY_CHUNK));
    stream.end();
  });
}

/** Each listed field's latest day and the mean crop ET of its last seven stored days (none for a field without days). */
const latestSelect = (fieldIds: string): string => `
  select v.id as field_id, w.date, w.planting_id, w.depletion_end_mm, w.taw_mm, w.raw_mm, w.recent_etc_mm
    from unnest(${fieldIds}) as v(id)
    join lateral (
      select max(d.date) as date, (array_agg(d.planting_id order by d.date desc))[1] as planting_id,
             (array_agg(d.depletion_end_mm order by d.date desc))[1] as depletion_end_mm,
             (array_agg(d.taw_mm order by d.date desc))[1] as taw_mm, (array_agg(d.raw_mm order by d.date desc))[1] as raw_mm,
             avg(d.etc_mm) as recent_etc_mm
        from (select date, planting_id, depletion_end_mm, taw_mm, raw_mm, etc_mm from account_days
               where field_id = v.id order by date desc limit 7) d
      having count(*) > 0
    ) w on true`;

/** Array literal of values Rootbank generated (uuids, dates, integers), none of which needs quoting. */
function arrayLiteral(values: readonly (string | number)[], type: string): string {
  return `'{${values.join(",")}}'::${type}[]`;
}

type Result = { rows: Record<string, unknown>[] };

/** (field, document id) pairs as each field's set of document ids. */
function byField(pairs: readonly (readonly [string, string])[]): Map<string, Set<string>> {
  const out = new Map<string, Set<string>>();
  for (const [field, id] of pairs) {
    const set = out.get(field);
    if (set) set.add(id);
    else out.set(field, new Set([id]));
  }
  return out;
}

/**
 * Rewrites fields' account days in one transaction on one connection, in a few exchanges so that the
 * server waits little on a client busy computing the next batch:
 * 1. lock the fields and plantings written for (key share, as a foreign key check would), list the
 *    fields' stored documents, delete each field's days from its date on, and list the documents the
 *    deleted days used;
 * 2. copy `rows` in, then the documents a field did not have (binary COPY);
 * 3. drop the documents no day uses any more, drop or unlink the rows of a field or planting deleted
 *    before the lock, refresh the fields' latest-day rows, clear the marks whose counter is unchanged
 *    (compare-and-set), and commit.
 * Returns the ids whose mark was cleared.
 */
export async function rewriteAccountDays(
  deleteFrom: readonly { fieldId: string; fromDate: string }[],
  rows: AccountDayRows,
  marks: readonly { fieldId: string; seq: number }[],
  conn: Knex = db,
): Promise<string[]> {
  if (deleteFrom.length === 0 && rows.length === 0 && marks.length === 0) return [];
  const ids = rows.ids();
  const pairs = rows.documentsByField();
  const fieldIds = [...new Set([...deleteFrom.map((d) => d.fieldId), ...ids.fieldIds])];
  const plantingIds = ids.plantingIds;

  const client = (await conn.client.acquireConnection()) as PoolClient;
  const exchange = async (statements: string[]): Promise<Result[]> => {
    const res = (await client.query(statements.join(";\n"))) as unknown as Result | Result[];
    return Array.isArray(res) ? res : [res];
  };
  try {
    const first = await exchange([
      "begin",
      // The account grows by a season a batch, faster than statistics follow; a stale estimate would turn
      // the per-field delete below into a scan of the whole table.
      "set local enable_seqscan = off",
      `select id from fields where id = any(${arrayLiteral(fieldIds, "uuid")}) order by id for key share`,
      `select id from plantings where id = any(${arrayLiteral(plantingIds, "uuid")}) order by id for key share`,
      `select field_id, replace(id::text, '-', '') as id from account_provenance where field_id = any(${arrayLiteral(fieldIds, "uuid")})`,
      deleteFrom.length
        ? "with d as (delete from account_days a " +
          `using unnest(${arrayLiteral(deleteFrom.map((d) => d.fieldId), "uuid")}, ${arrayLiteral(deleteFrom.map((d) => d.fromDate), "date")}) ` +
          "as v(field_id, from_date) where a.field_id = v.field_id and a.date >= v.from_date returning a.field_id, a.provenance_id) " +
          "select distinct field_id, replace(provenance_id::text, '-', '') as provenance_id from d"
        : "select null::uuid as field_id, null::text as provenance_id where false",
    ]);
    const live = new Set(first[2]!.rows.map((r) => String(r.id)));
    const livePlantings = new Set(first[3]!.rows.map((r) => String(r.id)));
    const stored = byField(first[4]!.rows.map((r) => [String(r.field_id), String(r.id)] as const));
    const dropped = first[5]!.rows as { field_id: string; provenance_id: string }[];

    if (rows.length) await copyIn(client, COPY_DAYS, rows.copyData());
    // The documents a field does not have yet (we hold its key-share lock, so no one else adds them).
    const add = pairs.fieldIds
      .map((_, k) => k)
      .filter((k) => live.has(pairs.fieldIds[k]!) && !stored.get(pairs.fieldIds[k]!)?.has(rows.provenanceIds[pairs.docs[k]!]!));
    if (add.length) {
      await copyIn(
        client,
        COPY_DOCUMENTS,
        documentsCopyData(
          add.map((k) => pairs.fieldIds[k]!),
          add.map((k) => rows.provenanceIds[pairs.docs[k]!]!),
          add.map((k) => rows.provenanceTexts[pairs.docs[k]!]!),
        ),
      );
    }

    const then: string[] = [];
    const used = byField(pairs.fieldIds.map((f, k) => [f, rows.provenanceIds[pairs.docs[k]!]!] as const));
    const unused = dropped.filter((d) => !used.get(d.field_id)?.has(d.provenance_id));
    if (unused.length) {
      then.push(
        `delete from account_provenance p using unnest(${arrayLiteral(unused.map((d) => d.field_id), "uuid")}, ${arrayLiteral(unused.map((d) => d.provenance_id), "uuid")}) ` +
          "as c(field_id, id) where p.field_id = c.field_id and p.id = c.id " +
          "and not exists (select 1 from account_days a where a.field_id = c.field_id and a.provenance_id = c.id)",
      );
    }
    const gone = fieldIds.filter((f) => !live.has(f));
    if (gone.length) then.push(`delete from account_days where field_id = any(${arrayLiteral(gone, "uuid")})`);
    const unlinked = plantingIds.filter((p) => !livePlantings.has(p));
    if (unlinked.length) {
      then.push(
        `update account_days set planting_id = null where field_id = any(${arrayLiteral(fieldIds, "uuid")}) and planting_id = any(${arrayLiteral(unlinked, "uuid")})`,
      );
    }
    const liveIds = arrayLiteral(fieldIds.filter((f) => live.has(f)), "uuid");
    then.push(`delete from account_latest where field_id = any(${liveIds})`);
    then.push(`insert into account_latest (field_id, date, planting_id, depletion_end_mm, taw_mm, raw_mm, recent_etc_mm) ${latestSelect(liveIds)}`);
    then.push(
      marks.length
        ? `update fields f set account_dirty_from = null from unnest(${arrayLiteral(marks.map((m) => m.fieldId), "uuid")}, ${arrayLiteral(marks.map((m) => m.seq), "bigint")}) ` +
            "as v(id, seq) where f.id = v.id and f.account_dirty_seq = v.seq returning f.id"
        : "select null::uuid as id where false",
    );
    then.push("commit");
    const last = await exchange(then);
    return last[last.length - 2]!.rows.map((r) => String(r.id));
  } catch (err) {
    await client.query("rollback").catch(() => undefined);
    throw shortError(err);
  } finally {
    await conn.client.releaseConnection(client);
  }
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

/** One stored day of a field's account, as the API shows it (the day's terms are shared with the client). */
export interface StoredAccountDay extends Omit<AccountDayDto, "provenance"> {
  plantingId: string | null;
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

/** Account days with their provenance document (stored once per field in account_provenance). */
function withProvenance(conn: Knex) {
  return conn("account_days as a")
    .leftJoin("account_provenance as p", (j) => j.on("p.field_id", "a.field_id").andOn("p.id", "a.provenance_id"))
    .select("a.*", "p.doc as provenance");
}

/** A field's account days from `from` to `to`, oldest first. */
export async function listAccountDays(fieldId: string, from: string, to: string, conn: Knex = db): Promise<StoredAccountDay[]> {
  const rows = (await withProvenance(conn).where("a.field_id", fieldId).whereBetween("a.date", [from, to]).orderBy("a.date")) as Row[];
  return rows.map(toStoredAccountDay);
}

/** The latest stored days of a field (newest first). */
export async function latestAccountDays(fieldId: string, limit: number, conn: Knex = db): Promise<StoredAccountDay[]> {
  const rows = (await withProvenance(conn).where("a.field_id", fieldId).orderBy("a.date", "desc").limit(limit)) as Row[];
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
 * days, from account_latest (one row per field, kept by the recompute's rewrite).
 */
export async function farmStatusRows(farmId: string, conn: Knex = db): Promise<FieldStatusRow[]> {
  const res = await conn.raw<{ rows: Row[] }>(
    `select f.id, f.name, f.account_dirty_from, l.date, l.depletion_end_mm, l.taw_mm, l.raw_mm, p.mad, l.recent_etc_mm as etc
       from fields f
       left join account_latest l on l.field_id = f.id
       left join plantings p on p.id = l.planting_id
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
