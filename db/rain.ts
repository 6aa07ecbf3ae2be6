import "server-only";
import type { Knex } from "knex";
import { markFieldsDirty } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import type { Author } from "@/lib/auth/api-tokens";
import { accountDayOfInstant, accountDayOfManualReading } from "@/lib/waterbalance";
import type { RainReadingPatch, RainRecordsInput } from "@/lib/validation/rain";
import { audit } from "./audit";
import { getFarm, type Farm } from "./farms";
import { db } from "./knex";

export interface RainReading {
  id: string;
  gaugeId: string;
  readAt: string;
  rainDate: string;
  depthMm: number;
  trace: boolean;
  hasPhoto: boolean;
  note: string | null;
  flagged: boolean;
  flagReason: string | null;
}

interface RainReadingRow {
  id: string;
  gauge_id: string;
  read_at: Date;
  rain_date: string;
  depth_mm: number;
  trace: boolean;
  photo_path: string | null;
  note: string | null;
  flagged: boolean;
  flag_reason: string | null;
}

export function toRainReading(r: RainReadingRow): RainReading {
  return {
    id: r.id,
    gaugeId: r.gauge_id,
    readAt: new Date(r.read_at).toISOString(),
    rainDate: r.rain_date,
    depthMm: r.depth_mm,
    trace: r.trace,
    hasPhoto: r.photo_path !== null,
    note: r.note,
    flagged: r.flagged,
    flagReason: r.flag_reason,
  };
}

export interface Gauge {
  id: string;
  name: string;
}

/** The farm's gauge, or a 404 naming the field that pointed at it (another farm's gauge looks absent). */
export async function requireGauge(farmId: string, gaugeId: string, trx: Knex = db): Promise<Gauge> {
  const row = (await trx("gauges").where({ id: gaugeId, farm_id: farmId }).whereNull("archived_at").first("id", "name")) as Gauge | undefined;
  if (!row) throw new AppError("not_found", "No such gauge on this farm.", { gaugeId: "No such gauge on this farm" });
  return row;
}

export async function requireFarm(farmId: string): Promise<Farm> {
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  return farm;
}

/** The day a reading is booked to: the reading-day rule of the engine, at the farm's boundary hour. */
export function readingDay(farm: Farm, readAt: string): string {
  return accountDayOfManualReading(readAt, farm.timeZone, farm.rainDayBoundaryHour);
}

function isGaugeDayConflict(err: unknown): boolean {
  return (err as { code?: string; constraint?: string }).code === "23505" &&
    (err as { constraint?: string }).constraint === "rain_readings_gauge_day_unique";
}

function gaugeDayConflict(gauge: string, rainDate: string): AppError {
  return new AppError("conflict", `${gauge} already has a reading for ${rainDate}. Correct that reading instead of adding a second one.`, {
    rainDate: "This gauge already has a reading for that day",
  });
}

const readingsOfFarm = (farmId: string, trx: Knex = db) =>
  trx("rain_readings as r").join("gauges as g", "g.id", "r.gauge_id").where("g.farm_id", farmId);

async function readingRow(farmId: string, id: string, trx: Knex = db): Promise<RainReadingRow | undefined> {
  return (await readingsOfFarm(farmId, trx).where("r.id", id).first("r.*")) as RainReadingRow | undefined;
}

export interface NewRainReading {
  id?: string;
  gaugeId: string;
  readAt: string;
  rainDate: string;
  depthMm: number;
  trace: boolean;
  note: string | null;
}

/**
 * Stores a reading, or returns the stored one when the client sends the same id again. `attach` runs
 * inside the transaction for a new row only (to store its photo), and returns the photo's storage key.
 */
export async function createRainReading(
  farmId: string,
  author: Author,
  input: NewRainReading,
  attach?: (readingId: string) => Promise<string>,
): Promise<{ reading: RainReading; created: boolean }> {
  const gauge = await requireGauge(farmId, input.gaugeId);
  return db.transaction(async (trx) => {
    const row = {
      ...(input.id ? { id: input.id } : {}),
      gauge_id: gauge.id,
      read_at: input.readAt,
      rain_date: input.rainDate,
      depth_mm: input.depthMm,
      trace: input.trace,
      note: input.note,
      created_by: author.userId,
      updated_by: author.userId,
    };
    let result: { row: RainReadingRow; created: boolean };
    try {
      result = await insertOnce<RainReadingRow>(trx, "rain_readings", row, async (existing) => (await readingRow(farmId, existing.id, trx)) !== undefined);
    } catch (err) {
      if (isGaugeDayConflict(err)) throw gaugeDayConflict(gauge.name, input.rainDate);
      throw err;
    }
    if (!result.created) return { reading: toRainReading(result.row), created: false };
    let stored = result.row;
    if (attach) {
      const key = await attach(stored.id);
      const [withPhoto] = (await trx("rain_readings").where({ id: stored.id }).update({ photo_path: key }).returning("*")) as RainReadingRow[];
      stored = withPhoto!;
    }
    const reading = toRainReading(stored);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "create", entity: "rain_reading", entityId: reading.id, after: reading }, trx);
    await markFieldsDirty(trx, { farmId }, reading.rainDate);
    return { reading, created: true };
  });
}

/** Corrects a reading; a new read time moves the reading day unless the day is given too. */
export async function updateRainReading(farmId: string, author: Author, id: string, patch: RainReadingPatch): Promise<RainReading> {
  const farm = await requireFarm(farmId);
  return db.transaction(async (trx) => {
    const existing = await readingRow(farmId, id, trx);
    if (!existing) throw new AppError("not_found", "No such rain reading.");
    const before = toRainReading(existing);
    const readAt = patch.readAt ?? before.readAt;
    const changes = {
      read_at: readAt,
      rain_date: patch.rainDate ?? (patch.readAt ? readingDay(farm, readAt) : before.rainDate),
      depth_mm: patch.depthMm ?? (patch.trace ? 0 : before.depthMm),
      trace: patch.trace ?? (patch.depthMm !== undefined && patch.depthMm > 0 ? false : before.trace),
      note: patch.note === undefined ? before.note : patch.note,
      updated_by: author.userId,
    };
    let updated: RainReadingRow | undefined;
    try {
      [updated] = (await trx("rain_readings").where({ id }).update(changes).returning("*")) as RainReadingRow[];
    } catch (err) {
      if (isGaugeDayConflict(err)) {
        const gauge = await requireGauge(farmId, existing.gauge_id);
        throw gaugeDayConflict(gauge.name, changes.rain_date);
      }
      throw err;
    }
    const after = toRainReading(updated!);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "update", entity: "rain_reading", entityId: id, before, after, reason: patch.reason }, trx);
    await markFieldsDirty(trx, { farmId }, before.rainDate < after.rainDate ? before.rainDate : after.rainDate);
    return after;
  });
}

/** Deletes a reading; returns its photo's storage key (to remove once the delete has committed). */
export async function deleteRainReading(farmId: string, author: Author, id: string, reason?: string): Promise<{ photoKey: string | null }> {
  return db.transaction(async (trx) => {
    const existing = await readingRow(farmId, id, trx);
    if (!existing) throw new AppError("not_found", "No such rain reading.");
    await trx("rain_readings").where({ id }).delete();
    const before = toRainReading(existing);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "delete", entity: "rain_reading", entityId: id, before, reason }, trx);
    await markFieldsDirty(trx, { farmId }, before.rainDate);
    return { photoKey: existing.photo_path };
  });
}

export async function getRainReading(farmId: string, id: string): Promise<RainReading | undefined> {
  const row = await readingRow(farmId, id);
  return row ? toRainReading(row) : undefined;
}

export async function readingPhotoKey(farmId: string, id: string): Promise<string | null | undefined> {
  const row = await readingRow(farmId, id);
  return row ? row.photo_path : undefined;
}

export async function listRainReadings(
  farmId: string,
  filter: { from?: string; to?: string; gaugeId?: string },
  page: PageQuery,
): Promise<{ rows: RainReading[]; total: number }> {
  const q = readingsOfFarm(farmId);
  if (filter.gaugeId) q.where("r.gauge_id", filter.gaugeId);
  if (filter.from) q.where("r.rain_date", ">=", filter.from);
  if (filter.to) q.where("r.rain_date", "<=", filter.to);
  const [count] = (await q.clone().count<{ count: string }[]>("* as count")) as { count: string | number }[];
  const rows = (await q.select("r.*").orderBy([{ column: "r.rain_date", order: "desc" }, { column: "g.name" }]).limit(page.limit).offset(page.offset)) as RainReadingRow[];
  return { rows: rows.map(toRainReading), total: Number(count?.count ?? 0) };
}

export interface RainRecord {
  gaugeId: string;
  at: string;
  depthMm: number;
  intervalS: number | null;
  flagged: boolean;
}

interface RainRecordRow {
  gauge_id: string;
  at: Date;
  depth_mm: number;
  interval_s: number | null;
  flagged: boolean;
}

const toRainRecord = (r: RainRecordRow): RainRecord => ({
  gaugeId: r.gauge_id,
  at: new Date(r.at).toISOString(),
  depthMm: r.depth_mm,
  intervalS: r.interval_s,
  flagged: r.flagged,
});

// Seven columns a row keeps a chunk well under PostgreSQL's 65 535 bind parameters.
const RECORD_CHUNK = 2000;

/** Adds a batch of time-stamped records; one already stored for the same gauge and instant is skipped. */
export async function insertRainRecords(farmId: string, author: Author, input: RainRecordsInput): Promise<{ inserted: number; duplicates: number }> {
  const gauge = await requireGauge(farmId, input.gaugeId);
  const farm = await requireFarm(farmId);
  return db.transaction(async (trx) => {
    let inserted = 0;
    let earliestMs = Infinity;
    for (let i = 0; i < input.records.length; i += RECORD_CHUNK) {
      const rows = input.records.slice(i, i + RECORD_CHUNK).map((r) => ({
        gauge_id: gauge.id,
        at: r.at,
        depth_mm: r.depthMm,
        interval_s: r.intervalS ?? null,
        created_by: author.userId,
      }));
      const added = (await trx("rain_records").insert(rows).onConflict(["gauge_id", "at"]).ignore().returning("at")) as { at: Date }[];
      inserted += added.length;
      for (const a of added) earliestMs = Math.min(earliestMs, new Date(a.at).getTime());
    }
    const duplicates = input.records.length - inserted;
    if (inserted > 0) {
      const fromDate = accountDayOfInstant(earliestMs, farm.timeZone, farm.rainDayBoundaryHour);
      await audit(
        { farmId, userId: author.userId, actor: author.actor, action: "import", entity: "rain_records", entityId: gauge.id, after: { inserted, duplicates, fromDate } },
        trx,
      );
      await markFieldsDirty(trx, { farmId }, fromDate);
    }
    return { inserted, duplicates };
  });
}

export async function listRainRecords(
  farmId: string,
  filter: { gaugeId?: string; from?: string; to?: string },
  page: PageQuery,
): Promise<{ rows: RainRecord[]; total: number }> {
  const q = db("rain_records as r").join("gauges as g", "g.id", "r.gauge_id").where("g.farm_id", farmId);
  if (filter.gaugeId) q.where("r.gauge_id", filter.gaugeId);
  if (filter.from) q.where("r.at", ">=", filter.from);
  if (filter.to) q.where("r.at", "<", filter.to);
  const [count] = (await q.clone().count("* as count")) as { count: string | number }[];
  const rows = (await q.select("r.*").orderBy([{ column: "r.at" }, { column: "r.gauge_id" }]).limit(page.limit).offset(page.offset)) as RainRecordRow[];
  return { rows: rows.map(toRainRecord), total: Number(count?.count ?? 0) };
}
