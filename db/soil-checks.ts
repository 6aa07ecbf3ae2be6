import "server-only";
import type { Knex } from "knex";
import { markFieldsDirty } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import type { Author } from "@/lib/auth/api-tokens";
import { farmToday } from "@/lib/farm-time";
import type { SoilCheckInput, SoilCheckPatch } from "@/lib/validation/soil-check";
import { audit } from "./audit";
import { requireField } from "./irrigation";
import { db } from "./knex";
import { requireFarm } from "./rain";

export interface SoilCheck {
  id: string;
  fieldId: string;
  date: string;
  checkedAt: string;
  depletionMm: number;
  method: SoilCheckInput["method"];
  depthM: number | null;
  resetsAccount: boolean;
  note: string | null;
}

interface SoilCheckRow {
  id: string;
  field_id: string;
  date: string;
  checked_at: Date;
  depletion_mm: number;
  method: SoilCheckInput["method"];
  depth_m: number | null;
  resets_account: boolean;
  note: string | null;
}

export function toSoilCheck(r: SoilCheckRow): SoilCheck {
  return {
    id: r.id,
    fieldId: r.field_id,
    date: r.date,
    checkedAt: new Date(r.checked_at).toISOString(),
    depletionMm: r.depletion_mm,
    method: r.method,
    depthM: r.depth_m,
    resetsAccount: r.resets_account,
    note: r.note,
  };
}

async function checkRow(farmId: string, id: string, trx: Knex = db): Promise<SoilCheckRow | undefined> {
  return (await trx("soil_checks as c").join("fields as f", "f.id", "c.field_id").where({ "f.farm_id": farmId, "c.id": id }).first("c.*")) as
    | SoilCheckRow
    | undefined;
}

/** Stores a check; its day is given, or the farm's local date of the time it was taken. */
export async function createSoilCheck(farmId: string, author: Author, input: SoilCheckInput): Promise<{ check: SoilCheck; created: boolean }> {
  const farm = await requireFarm(farmId);
  const field = await requireField(farmId, input.fieldId);
  return db.transaction(async (trx) => {
    const row = {
      ...(input.id ? { id: input.id } : {}),
      field_id: field.id,
      date: input.date ?? farmToday(farm.timeZone, new Date(input.checkedAt!)),
      ...(input.checkedAt ? { checked_at: input.checkedAt } : {}),
      depletion_mm: input.depletionMm,
      method: input.method,
      depth_m: input.depthM ?? null,
      resets_account: input.resetsAccount,
      note: input.note ?? null,
      created_by: author.userId,
      updated_by: author.userId,
    };
    const result = await insertOnce<SoilCheckRow>(trx, "soil_checks", row, async (c) => (await checkRow(farmId, c.id, trx)) !== undefined);
    const check = toSoilCheck(result.row);
    if (result.created) {
      await audit({ farmId, userId: author.userId, actor: author.actor, action: "create", entity: "soil_check", entityId: check.id, after: check }, trx);
      await markFieldsDirty(trx, { fieldIds: [check.fieldId] }, check.date);
    }
    return { check, created: result.created };
  });
}

export async function updateSoilCheck(farmId: string, author: Author, id: string, patch: SoilCheckPatch): Promise<SoilCheck> {
  const farm = await requireFarm(farmId);
  return db.transaction(async (trx) => {
    const existing = await checkRow(farmId, id, trx);
    if (!existing) throw new AppError("not_found", "No such soil check.");
    const before = toSoilCheck(existing);
    const { reason, ...p } = patch;
    const changes = {
      // A new time moves the day with it unless the day is given too.
      date: p.date ?? (p.checkedAt ? farmToday(farm.timeZone, new Date(p.checkedAt)) : before.date),
      checked_at: p.checkedAt ?? before.checkedAt,
      depletion_mm: p.depletionMm ?? before.depletionMm,
      method: p.method ?? before.method,
      depth_m: p.depthM === undefined ? before.depthM : p.depthM,
      resets_account: p.resetsAccount ?? before.resetsAccount,
      note: p.note === undefined ? before.note : p.note,
      updated_by: author.userId,
    };
    const [row] = (await trx("soil_checks").where({ id }).update(changes).returning("*")) as SoilCheckRow[];
    const after = toSoilCheck(row!);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "update", entity: "soil_check", entityId: id, before, after, reason }, trx);
    await markFieldsDirty(trx, { fieldIds: [after.fieldId] }, before.date < after.date ? before.date : after.date);
    return after;
  });
}

export async function deleteSoilCheck(farmId: string, author: Author, id: string): Promise<void> {
  await db.transaction(async (trx) => {
    const existing = await checkRow(farmId, id, trx);
    if (!existing) throw new AppError("not_found", "No such soil check.");
    await trx("soil_checks").where({ id }).delete();
    const before = toSoilCheck(existing);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "delete", entity: "soil_check", entityId: id, before }, trx);
    await markFieldsDirty(trx, { fieldIds: [before.fieldId] }, before.date);
  });
}

export async function getSoilCheck(farmId: string, id: string): Promise<SoilCheck | undefined> {
  const row = await checkRow(farmId, id);
  return row ? toSoilCheck(row) : undefined;
}

export async function listSoilChecks(
  farmId: string,
  filter: { fieldId?: string; from?: string; to?: string },
  page: PageQuery,
): Promise<{ rows: SoilCheck[]; total: number }> {
  const q = db("soil_checks as c").join("fields as f", "f.id", "c.field_id").where("f.farm_id", farmId);
  if (filter.fieldId) q.where("c.field_id", filter.fieldId);
  if (filter.from) q.where("c.date", ">=", filter.from);
  if (filter.to) q.where("c.date", "<=", filter.to);
  const [count] = (await q.clone().count("* as count")) as { count: string | number }[];
  const rows = (await q.select("c.*").orderBy([{ column: "c.date", order: "desc" }, { column: "c.checked_at", order: "desc" }]).limit(page.limit).offset(page.offset)) as SoilCheckRow[];
  return { rows: rows.map(toSoilCheck), total: Number(count?.count ?? 0) };
}
