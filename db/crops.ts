import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import { CROP_ACCOUNT_KEYS, cropSchema, cropShape, type CropCreate, type CropPatch, type CropValues } from "@/lib/validation/crop";
import { audit } from "./audit";
import { db } from "./knex";

/** A crop: the farm's own (library false) or one of the published library's, which no farm may change. */
export interface Crop extends CropValues {
  id: string;
  farmId: string | null;
  library: boolean;
  createdAt: string;
  updatedAt: string;
}

const COLUMNS: Record<keyof CropValues, string> = {
  name: "name",
  kcIni: "kc_ini",
  kcMid: "kc_mid",
  kcEnd: "kc_end",
  kcbIni: "kcb_ini",
  kcbMid: "kcb_mid",
  kcbEnd: "kcb_end",
  stageIniDays: "stage_ini_days",
  stageDevDays: "stage_dev_days",
  stageMidDays: "stage_mid_days",
  stageLateDays: "stage_late_days",
  heightM: "height_m",
  rootMinM: "root_min_m",
  rootMaxM: "root_max_m",
  p: "p",
  curveNumber: "curve_number",
  runoffCover: "runoff_cover",
  source: "source",
  note: "note",
};
const KEYS = Object.keys(cropShape) as (keyof CropValues)[];

type Row = Record<string, unknown> & { id: string; farm_id: string | null };

export function toCrop(r: Row): Crop {
  const values = Object.fromEntries(KEYS.map((k) => [k, r[COLUMNS[k]] ?? null])) as unknown as CropValues;
  return {
    id: r.id,
    farmId: r.farm_id,
    library: r.farm_id === null,
    ...values,
    createdAt: (r.created_at as Date).toISOString(),
    updatedAt: (r.updated_at as Date).toISOString(),
  };
}

function toColumns(v: CropValues): Record<string, unknown> {
  return Object.fromEntries(KEYS.map((k) => [COLUMNS[k], v[k]]));
}

function valuesOf(c: Crop): CropValues {
  return Object.fromEntries(KEYS.map((k) => [k, c[k]])) as unknown as CropValues;
}

function visibleTo(q: Knex.QueryBuilder, farmId: string): void {
  q.where("farm_id", farmId).orWhereNull("farm_id");
}

/** The farm's own crops first, then the library's, by name. */
export async function listCrops(farmId: string, page: PageQuery): Promise<{ rows: Crop[]; total: number }> {
  const base = db("crops").where((q) => visibleTo(q, farmId));
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base.clone().orderByRaw("farm_id is null, name, id").limit(page.limit).offset(page.offset).select("*")) as Row[];
  return { rows: rows.map(toCrop), total: Number(n) };
}

export async function getCrop(farmId: string, id: string): Promise<Crop | undefined> {
  const row = (await db("crops").where({ id }).andWhere((q) => visibleTo(q, farmId)).first()) as Row | undefined;
  return row ? toCrop(row) : undefined;
}

const EMPTY = Object.fromEntries(KEYS.map((k) => [k, null])) as Record<keyof CropValues, null>;

async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
  const taken = await trx("crops")
    .where({ farm_id: farmId, name })
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .first("id");
  if (taken) throw new AppError("conflict", "This farm already has a crop with that name.", { name: "Already used by another crop on this farm" });
}

/** A farm's own crop: every value given, or a copy of a library crop with any values given on top. */
export async function createCrop(farmId: string, userId: string, input: CropCreate): Promise<{ crop: Crop; created: boolean }> {
  const { id, fromLibraryId, ...given } = input;
  const sent = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined));
  return db.transaction(async (trx) => {
    if (id) {
      const existing = (await trx("crops").where({ id }).first()) as Row | undefined;
      if (existing?.farm_id === farmId) return { crop: toCrop(existing), created: false };
    }
    let base: Partial<CropValues> = {};
    if (fromLibraryId) {
      const lib = (await trx("crops").where({ id: fromLibraryId }).whereNull("farm_id").first()) as Row | undefined;
      if (!lib) throw new AppError("invalid", "Some values are not valid.", { fromLibraryId: "No library crop has this id" });
      base = valuesOf(toCrop(lib));
    }
    const values = cropSchema.parse({ ...EMPTY, ...base, ...sent });
    await checkNameFree(trx, farmId, values.name, null);
    const { row, created } = await insertOnce<Row>(
      trx,
      "crops",
      { ...(id ? { id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
      (r) => r.farm_id === farmId,
    );
    const crop = toCrop(row);
    if (created) await audit({ farmId, userId, action: "create", entity: "crop", entityId: crop.id, after: crop, reason: fromLibraryId ? `copied from library crop ${fromLibraryId}` : null }, trx);
    return { crop, created };
  });
}

async function ownRow(trx: Knex.Transaction, farmId: string, id: string, verb: string): Promise<Row | undefined> {
  const row = (await trx("crops").where({ id }).andWhere((q) => visibleTo(q, farmId)).forUpdate().first()) as Row | undefined;
  if (row && row.farm_id === null) {
    throw new AppError("forbidden", `Library crops are shared by every farm and cannot be ${verb}. Copy it to your farm (POST with fromLibraryId) and change the copy.`);
  }
  return row;
}

export async function updateCrop(farmId: string, userId: string, id: string, patch: CropPatch): Promise<Crop | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = await ownRow(trx, farmId, id, "changed");
    if (!row) return undefined;
    const before = toCrop(row);
    const { reason, ...changes } = patch;
    const values = cropSchema.parse({ ...valuesOf(before), ...changes });
    if (values.name !== before.name) await checkNameFree(trx, farmId, values.name, id);
    const [updated] = (await trx("crops").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    const after = toCrop(updated!);
    await audit({ farmId, userId, action: "update", entity: "crop", entityId: id, before, after, reason: reason ?? null }, trx);
    let dirty = false;
    if (CROP_ACCOUNT_KEYS.some((k) => before[k] !== after[k])) {
      // Each planting of this crop is stale from its own planting date.
      const plantings = (await trx("plantings").where({ crop_id: id }).select("field_id", "planting_date")) as { field_id: string; planting_date: string }[];
      for (const p of plantings) await markFieldsDirty(trx, { fieldIds: [p.field_id] }, p.planting_date);
      dirty = plantings.length > 0;
    }
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}

/** Deletes a farm crop no planting uses; past seasons' accounts still name their crop. */
export async function deleteCrop(farmId: string, userId: string, id: string): Promise<boolean> {
  return db.transaction(async (trx) => {
    const row = await ownRow(trx, farmId, id, "deleted");
    if (!row) return false;
    const uses = (await trx("plantings").where({ crop_id: id }).count({ n: "*" })) as [{ n: number }];
    if (Number(uses[0].n) > 0) {
      throw new AppError("conflict", `This crop is planted in ${uses[0].n} planting(s). Change or remove those plantings first.`, { id: "In use" });
    }
    await trx("crops").where({ id }).delete();
    await audit({ farmId, userId, action: "delete", entity: "crop", entityId: id, before: toCrop(row) }, trx);
    return true;
  });
}
