import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { requestRecompute } from "@/lib/accounts/dirty";
import { SOIL_ACCOUNT_KEYS, soilSchema, soilShape, type SoilCreate, type SoilPatch, type SoilValues } from "@/lib/validation/soil";
import { findTexture } from "@/lib/waterbalance";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

/** A soil: the farm's own (library false) or one of the published library's, which no farm may change. */
export interface Soil extends SoilValues {
  id: string;
  farmId: string | null;
  library: boolean;
  createdAt: string;
  updatedAt: string;
}

const COLUMNS: Record<keyof SoilValues, string> = {
  name: "name",
  texture: "texture",
  thetaFc: "theta_fc",
  thetaWp: "theta_wp",
  thetaSat: "theta_sat",
  rewMm: "rew_mm",
  tewMm: "tew_mm",
  gaSuctionMm: "ga_suction_mm",
  gaKsatMmH: "ga_ksat_mm_h",
  gaPorosity: "ga_porosity",
  gaEffectivePorosity: "ga_effective_porosity",
  hydrologicGroup: "hydrologic_group",
  source: "source",
  note: "note",
};
const KEYS = Object.keys(soilShape) as (keyof SoilValues)[];

type Row = Record<string, unknown> & { id: string; farm_id: string | null };

export function toSoil(r: Row): Soil {
  const values = Object.fromEntries(KEYS.map((k) => [k, r[COLUMNS[k]] ?? null])) as unknown as SoilValues;
  return {
    id: r.id,
    farmId: r.farm_id,
    library: r.farm_id === null,
    ...values,
    createdAt: (r.created_at as Date).toISOString(),
    updatedAt: (r.updated_at as Date).toISOString(),
  };
}

function toColumns(v: SoilValues): Record<string, unknown> {
  return Object.fromEntries(KEYS.map((k) => [COLUMNS[k], v[k]]));
}

function valuesOf(s: Soil): SoilValues {
  return Object.fromEntries(KEYS.map((k) => [k, s[k]])) as unknown as SoilValues;
}

function visibleTo(q: Knex.QueryBuilder, farmId: string): void {
  q.where("farm_id", farmId).orWhereNull("farm_id");
}

/** The farm's own soils first, then the library's, by name. */
export async function listSoils(farmId: string, page: PageQuery): Promise<{ rows: Soil[]; total: number }> {
  const base = db("soils").where((q) => visibleTo(q, farmId));
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base
    .clone()
    .orderByRaw("farm_id is null, name, id")
    .limit(page.limit)
    .offset(page.offset)
    .select("*")) as Row[];
  return { rows: rows.map(toSoil), total: Number(n) };
}

export async function getSoil(farmId: string, id: string): Promise<Soil | undefined> {
  const row = (await db("soils").where({ id }).andWhere((q) => visibleTo(q, farmId)).first()) as Row | undefined;
  return row ? toSoil(row) : undefined;
}

/** Published defaults of a texture class: FAO-56 Table 19 water, Rawls et al. (1983) Green-Ampt. */
function textureDefaults(textureId: string): Partial<SoilValues> {
  const t = findTexture(textureId);
  if (!t) return {};
  return {
    name: t.name,
    thetaFc: t.thetaFc,
    thetaWp: t.thetaWp,
    thetaSat: t.greenAmpt.porosity,
    rewMm: t.rewMm,
    tewMm: t.tewMm,
    gaSuctionMm: t.greenAmpt.suctionMm,
    gaKsatMmH: t.greenAmpt.ksatMmH,
    gaPorosity: t.greenAmpt.porosity,
    gaEffectivePorosity: t.greenAmpt.effectivePorosity,
    source: `${t.waterSource}; Green-Ampt: ${t.greenAmptSource}`,
  };
}

const EMPTY: Record<keyof SoilValues, null> = Object.fromEntries(KEYS.map((k) => [k, null])) as Record<keyof SoilValues, null>;

async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
  const taken = await trx("soils")
    .where({ farm_id: farmId, name })
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .first("id");
  if (taken) throw new AppError("conflict", "This farm already has a soil with that name.", { name: "Already used by another soil on this farm" });
}

/** A farm's own soil: from a texture's defaults, or a copy of a library soil, with any values given on top. */
export async function createSoil(farmId: string, userId: string, input: SoilCreate): Promise<{ soil: Soil; created: boolean }> {
  const { id, fromLibraryId, ...given } = input;
  const sent = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined));
  return db.transaction(async (trx) => {
    if (id) {
      const existing = (await trx("soils").where({ id }).first()) as Row | undefined;
      if (existing?.farm_id === farmId) return { soil: toSoil(existing), created: false };
    }
    let base: Partial<SoilValues> = {};
    if (fromLibraryId) {
      const lib = (await trx("soils").where({ id: fromLibraryId }).whereNull("farm_id").first()) as Row | undefined;
      if (!lib) throw new AppError("invalid", "Some values are not valid.", { fromLibraryId: "No library soil has this id" });
      base = valuesOf(toSoil(lib));
      if (given.texture && given.texture !== base.texture) base = { ...base, ...textureDefaults(given.texture), name: base.name };
    } else if (given.texture) {
      base = textureDefaults(given.texture);
    }
    const values = soilSchema.parse({ ...EMPTY, ...base, ...sent });
    await checkNameFree(trx, farmId, values.name, null);
    const { row, created } = await insertOnce<Row>(
      trx,
      "soils",
      { ...(id ? { id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
      (r) => r.farm_id === farmId,
    );
    const soil = toSoil(row);
    if (created) await audit({ farmId, userId, action: "create", entity: "soil", entityId: soil.id, after: soil, reason: fromLibraryId ? `copied from library soil ${fromLibraryId}` : null }, trx);
    return { soil, created };
  });
}

/** The farm's own row, or 403 for a library row, or undefined. */
async function ownRow(trx: Knex.Transaction, farmId: string, id: string, verb: string): Promise<Row | undefined> {
  const row = (await trx("soils").where({ id }).andWhere((q) => visibleTo(q, farmId)).forUpdate().first()) as Row | undefined;
  if (row && row.farm_id === null) {
    throw new AppError("forbidden", `Library soils are shared by every farm and cannot be ${verb}. Copy it to your farm (POST with fromLibraryId) and change the copy.`);
  }
  return row;
}

export async function updateSoil(farmId: string, userId: string, id: string, patch: SoilPatch): Promise<Soil | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = await ownRow(trx, farmId, id, "changed");
    if (!row) return undefined;
    const before = toSoil(row);
    const { reason, ...changes } = patch;
    const values = soilSchema.parse({ ...valuesOf(before), ...changes });
    if (values.name !== before.name) await checkNameFree(trx, farmId, values.name, id);
    const [updated] = (await trx("soils").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    const after = toSoil(updated!);
    await audit({ farmId, userId, action: "update", entity: "soil", entityId: id, before, after, reason: reason ?? null }, trx);
    let dirty = false;
    if (SOIL_ACCOUNT_KEYS.some((k) => before[k] !== after[k])) {
      const fieldIds = (await trx("fields").where({ farm_id: farmId, soil_id: id }).pluck("id")) as string[];
      dirty = await markFieldsFromPlantings(trx, fieldIds);
    }
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}

/** Deletes a farm soil no field uses; a soil in use would leave fields without a root zone. */
export async function deleteSoil(farmId: string, userId: string, id: string): Promise<boolean> {
  return db.transaction(async (trx) => {
    const row = await ownRow(trx, farmId, id, "deleted");
    if (!row) return false;
    const users = (await trx("fields").where({ soil_id: id }).orderBy("name").pluck("name")) as string[];
    if (users.length > 0) {
      throw new AppError("conflict", `This soil is used by ${users.join(", ")}. Give those fields another soil first.`, { id: "In use" });
    }
    await trx("soils").where({ id }).delete();
    await audit({ farmId, userId, action: "delete", entity: "soil", entityId: id, before: toSoil(row) }, trx);
    return true;
  });
}
