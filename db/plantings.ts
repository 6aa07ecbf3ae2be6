import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import {
  PLANTING_ACCOUNT_KEYS,
  plantingSchema,
  plantingShape,
  type PlantingCreate,
  type PlantingPatch,
  type PlantingValues,
} from "@/lib/validation/planting";
import { audit } from "./audit";
import { db } from "./knex";

export interface Planting extends PlantingValues {
  id: string;
  createdAt: string;
  updatedAt: string;
}

const COLUMNS: Record<keyof PlantingValues, string> = {
  fieldId: "field_id",
  season: "season",
  cropId: "crop_id",
  plantingDate: "planting_date",
  endDate: "end_date",
  kcIni: "kc_ini",
  kcMid: "kc_mid",
  kcEnd: "kc_end",
  stageIniDays: "stage_ini_days",
  stageDevDays: "stage_dev_days",
  stageMidDays: "stage_mid_days",
  stageLateDays: "stage_late_days",
  rootMinM: "root_min_m",
  rootMaxM: "root_max_m",
  p: "p",
  mad: "mad",
  climateAdjust: "climate_adjust",
  kcScale: "kc_scale",
  initialDepletionMm: "initial_depletion_mm",
  note: "note",
  yieldTHa: "yield_t_ha",
};
const KEYS = Object.keys(plantingShape) as (keyof PlantingValues)[];

type Row = Record<string, unknown> & { id: string; field_id: string; planting_date: string };

export function toPlanting(r: Row): Planting {
  const values = Object.fromEntries(KEYS.map((k) => [k, r[COLUMNS[k]] ?? null])) as unknown as PlantingValues;
  return { id: r.id, ...values, createdAt: (r.created_at as Date).toISOString(), updatedAt: (r.updated_at as Date).toISOString() };
}

function toColumns(v: Partial<PlantingValues>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const k of KEYS) if (v[k] !== undefined) out[COLUMNS[k]] = v[k];
  return out;
}

/**
 * Marks the given fields' accounts stale from each field's earliest planting date (the first day any of
 * its seasons' accounts covers). Fields with no planting have no account and are left alone.
 * Returns whether any field was marked.
 */
export async function markFieldsFromPlantings(trx: Knex.Transaction, fieldIds: readonly string[]): Promise<boolean> {
  if (fieldIds.length === 0) return false;
  const rows = (await trx("plantings")
    .whereIn("field_id", fieldIds)
    .groupBy("field_id")
    .select("field_id")
    .min({ from: "planting_date" })) as { field_id: string; from: string }[];
  const byDate = new Map<string, string[]>();
  for (const r of rows) byDate.set(r.from, [...(byDate.get(r.from) ?? []), r.field_id]);
  for (const [from, ids] of byDate) await markFieldsDirty(trx, { fieldIds: ids }, from);
  return rows.length > 0;
}

/** A planting of this farm (through its field), or undefined: another farm's id is not found. */
async function findRow(trx: Knex | Knex.Transaction, farmId: string, id: string): Promise<Row | undefined> {
  return (await trx("plantings as p")
    .join("fields as f", "f.id", "p.field_id")
    .where({ "p.id": id, "f.farm_id": farmId })
    .first("p.*")) as Row | undefined;
}

export async function getPlanting(farmId: string, id: string): Promise<Planting | undefined> {
  const row = await findRow(db, farmId, id);
  return row ? toPlanting(row) : undefined;
}

export async function listPlantings(farmId: string, page: PageQuery, fieldId?: string): Promise<{ rows: Planting[]; total: number }> {
  const base = db("plantings as p")
    .join("fields as f", "f.id", "p.field_id")
    .where("f.farm_id", farmId)
    .modify((q) => {
      if (fieldId) q.where("p.field_id", fieldId);
    });
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base.clone().orderBy([{ column: "p.planting_date", order: "desc" }, "p.id"]).limit(page.limit).offset(page.offset).select("p.*")) as Row[];
  return { rows: rows.map(toPlanting), total: Number(n) };
}

/** The field must be this farm's, the crop this farm's or the library's; root depths checked with the crop's. */
async function checkReferences(trx: Knex.Transaction, farmId: string, v: PlantingValues): Promise<void> {
  const field = await trx("fields").where({ id: v.fieldId, farm_id: farmId }).first("id");
  if (!field) throw new AppError("invalid", "That field is not on this farm.", { fieldId: "No such field on this farm" });
  const crop = (await trx("crops")
    .where({ id: v.cropId })
    .andWhere((q) => q.where({ farm_id: farmId }).orWhereNull("farm_id"))
    .first("root_min_m", "root_max_m")) as { root_min_m: number; root_max_m: number } | undefined;
  if (!crop) throw new AppError("invalid", "That crop is neither this farm's nor in the library.", { cropId: "No such crop on this farm or in the library" });
  if ((v.rootMinM ?? crop.root_min_m) > (v.rootMaxM ?? crop.root_max_m)) {
    throw new AppError("invalid", "Some values are not valid.", {
      rootMinM: "Initial root depth cannot be deeper than the maximum root depth (the crop's value counts where none is given)",
    });
  }
}

/** One crop at a time: a field's plantings may not overlap, or its account would not know which crop grows. */
async function checkOverlap(trx: Knex.Transaction, v: PlantingValues, exceptId: string | null): Promise<void> {
  const clash = (await trx("plantings")
    .where("field_id", v.fieldId)
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .where("planting_date", "<=", v.endDate ?? "infinity")
    .andWhereRaw("coalesce(end_date, 'infinity'::date) >= ?::date", [v.plantingDate])
    .first("season", "planting_date", "end_date")) as { season: string; planting_date: string; end_date: string | null } | undefined;
  if (clash) {
    throw new AppError("conflict", "This field already has a planting in that time.", {
      plantingDate: `Overlaps the ${clash.season} planting from ${clash.planting_date}${clash.end_date ? ` to ${clash.end_date}` : " (no end date)"}`,
    });
  }
}

export async function createPlanting(farmId: string, userId: string, input: PlantingCreate): Promise<{ planting: Planting; created: boolean }> {
  const { id, ...given } = input;
  const values = plantingSchema.parse({
    ...Object.fromEntries(KEYS.map((k) => [k, null])),
    climateAdjust: true,
    initialDepletionMm: 0,
    ...Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined)),
  });
  const result = await db.transaction(async (trx) => {
    const existing = id ? await trx("plantings").where({ id }).first("id") : undefined;
    if (!existing) {
      await checkReferences(trx, farmId, values);
      await checkOverlap(trx, values, null);
    }
    const { row, created } = await insertOnce<Row>(
      trx,
      "plantings",
      { ...(id ? { id } : {}), ...toColumns(values), created_by: userId, updated_by: userId },
      async (r) => Boolean(await trx("fields").where({ id: r.field_id, farm_id: farmId }).first("id")),
    );
    const planting = toPlanting(row);
    if (created) {
      await audit({ farmId, userId, action: "create", entity: "planting", entityId: planting.id, after: planting }, trx);
      await markFieldsDirty(trx, { fieldIds: [planting.fieldId] }, planting.plantingDate);
    }
    return { planting, created };
  });
  if (result.created) await requestRecompute(farmId);
  return result;
}

/** Changes a planting; `reason` (why the agronomist changed it) goes into the audit entry. */
export async function updatePlanting(farmId: string, userId: string, id: string, patch: PlantingPatch, reason?: string): Promise<Planting | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = await findRow(trx, farmId, id);
    if (!row) return undefined;
    const before = toPlanting(row);
    const values = plantingSchema.parse({ ...pick(before), ...patch });
    await checkReferences(trx, farmId, values);
    await checkOverlap(trx, values, id);
    const [updated] = (await trx("plantings").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    const after = toPlanting(updated!);
    await audit({ farmId, userId, action: "update", entity: "planting", entityId: id, before, after, reason: reason ?? null }, trx);
    const changed = PLANTING_ACCOUNT_KEYS.some((k) => before[k as keyof PlantingValues] !== after[k as keyof PlantingValues]);
    if (changed) {
      // A later planting date still invalidates days from the old one: those days are no longer this crop's.
      const from = before.plantingDate < after.plantingDate ? before.plantingDate : after.plantingDate;
      await markFieldsDirty(trx, { fieldIds: [after.fieldId] }, from);
    }
    return { after, changed };
  });
  if (result?.changed) await requestRecompute(farmId);
  return result?.after;
}

export async function deletePlanting(farmId: string, userId: string, id: string): Promise<boolean> {
  const found = await db.transaction(async (trx) => {
    const row = await findRow(trx, farmId, id);
    if (!row) return false;
    const before = toPlanting(row);
    await trx("plantings").where({ id }).delete();
    await audit({ farmId, userId, action: "delete", entity: "planting", entityId: id, before }, trx);
    await markFieldsDirty(trx, { fieldIds: [before.fieldId] }, before.plantingDate);
    return true;
  });
  if (found) await requestRecompute(farmId);
  return found;
}

function pick(p: Planting): PlantingValues {
  return Object.fromEntries(KEYS.map((k) => [k, p[k]])) as unknown as PlantingValues;
}
