import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { requestRecompute } from "@/lib/accounts/dirty";
import { boundaryAreaHa, boundaryCentroid, type Boundary } from "@/lib/geo/boundary";
import { FIELD_ACCOUNT_KEYS, type FieldCreate, type FieldPatch } from "@/lib/validation/field";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

export interface FieldSummary {
  id: string;
  name: string;
  areaHa: number;
  soilName: string | null;
  cropName: string | null;
  systemName: string | null;
}

/** The farm's fields with their soil, current crop and irrigation system, by name. */
export async function listFieldSummaries(farmId: string, onDate: string): Promise<FieldSummary[]> {
  const rows = await db("fields as f")
    .leftJoin("soils as s", "s.id", "f.soil_id")
    .leftJoin("irrigation_systems as sys", "sys.id", "f.irrigation_system_id")
    .leftJoin("plantings as p", function () {
      this.on("p.field_id", "f.id")
        .andOn("p.planting_date", "<=", db.raw("?::date", [onDate]))
        .andOn(db.raw("coalesce(p.end_date, 'infinity'::date) >= ?::date", [onDate]));
    })
    .leftJoin("crops as c", "c.id", "p.crop_id")
    .where("f.farm_id", farmId)
    .whereNull("f.archived_at")
    .orderBy("f.name")
    .select("f.id", "f.name", "f.area_ha", "s.name as soil_name", "c.name as crop_name", "sys.name as system_name");
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    areaHa: Number(r.area_ha),
    soilName: r.soil_name,
    cropName: r.crop_name,
    systemName: r.system_name,
  }));
}

/** A field as the API shows it. The centroid is derived from the boundary; the area too when there is one. */
export interface Field {
  id: string;
  farmId: string;
  name: string;
  boundary: Boundary | null;
  areaHa: number;
  centroidLat: number | null;
  centroidLon: number | null;
  soilId: string | null;
  slopePct: number | null;
  irrigationSystemId: string | null;
  gaugeId: string | null;
  curveNumber: number | null;
  /** earliest day whose account waits for a recompute; null = up to date */
  accountDirtyFrom: string | null;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

interface Row {
  id: string;
  farm_id: string;
  name: string;
  boundary: Boundary | null;
  area_ha: number;
  centroid_lat: number | null;
  centroid_lon: number | null;
  soil_id: string | null;
  slope_pct: number | null;
  irrigation_system_id: string | null;
  gauge_id: string | null;
  curve_number: number | null;
  account_dirty_from: string | null;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

export function toField(r: Row): Field {
  return {
    id: r.id,
    farmId: r.farm_id,
    name: r.name,
    boundary: r.boundary,
    areaHa: r.area_ha,
    centroidLat: r.centroid_lat,
    centroidLon: r.centroid_lon,
    soilId: r.soil_id,
    slopePct: r.slope_pct,
    irrigationSystemId: r.irrigation_system_id,
    gaugeId: r.gauge_id,
    curveNumber: r.curve_number,
    accountDirtyFrom: r.account_dirty_from,
    archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

type Values = Omit<Field, "id" | "farmId" | "accountDirtyFrom" | "archivedAt" | "createdAt" | "updatedAt">;

function toColumns(v: Values): Record<string, unknown> {
  return {
    name: v.name,
    boundary: v.boundary === null ? null : JSON.stringify(v.boundary),
    area_ha: v.areaHa,
    centroid_lat: v.centroidLat,
    centroid_lon: v.centroidLon,
    soil_id: v.soilId,
    slope_pct: v.slopePct,
    irrigation_system_id: v.irrigationSystemId,
    gauge_id: v.gaugeId,
    curve_number: v.curveNumber,
  };
}

/** Area and centroid from a boundary; more than 100 000 ha is a coordinate slip, not a field. */
function measured(boundary: Boundary): Pick<Values, "areaHa" | "centroidLat" | "centroidLon"> {
  const areaHa = Math.round(boundaryAreaHa(boundary) * 10_000) / 10_000;
  if (areaHa > 100_000) {
    throw new AppError("invalid", "Some values are not valid.", {
      boundary: `The boundary encloses ${Math.round(areaHa).toLocaleString("en")} ha; a field is at most 100 000 ha. Are longitude and latitude in GeoJSON's order?`,
    });
  }
  const c = boundaryCentroid(boundary);
  return { areaHa, centroidLat: c.latitude, centroidLon: c.longitude };
}

/** A field's soil must be the farm's or the library's; its system and gauge the farm's own, in use. */
async function checkReferences(trx: Knex.Transaction, farmId: string, v: Values, before?: Values): Promise<void> {
  const fields: Record<string, string> = {};
  if (v.soilId && v.soilId !== before?.soilId) {
    const soil = await trx("soils").where({ id: v.soilId }).andWhere((q) => q.where({ farm_id: farmId }).orWhereNull("farm_id")).first("id");
    if (!soil) fields.soilId = "No such soil on this farm or in the library";
  }
  if (v.irrigationSystemId && v.irrigationSystemId !== before?.irrigationSystemId) {
    const system = await trx("irrigation_systems").where({ id: v.irrigationSystemId, farm_id: farmId }).whereNull("archived_at").first("id");
    if (!system) fields.irrigationSystemId = "No such irrigation system in use on this farm";
  }
  if (v.gaugeId && v.gaugeId !== before?.gaugeId) {
    const gauge = await trx("gauges").where({ id: v.gaugeId, farm_id: farmId }).whereNull("archived_at").first("id");
    if (!gauge) fields.gaugeId = "No such rain gauge in use on this farm";
  }
  if (Object.keys(fields).length > 0) throw new AppError("invalid", "A field can only use this farm's soils, systems and gauges.", fields);
}

async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
  const taken = await trx("fields")
    .where({ farm_id: farmId, name })
    .whereNull("archived_at")
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .first("id");
  if (taken) throw new AppError("conflict", "This farm already has a field with that name.", { name: "Already used by another field on this farm" });
}

export async function listFields(farmId: string, page: PageQuery, includeArchived = false): Promise<{ rows: Field[]; total: number }> {
  const base = db("fields")
    .where({ farm_id: farmId })
    .modify((q) => {
      if (!includeArchived) q.whereNull("archived_at");
    });
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base.clone().orderBy(["name", "id"]).limit(page.limit).offset(page.offset).select("*")) as Row[];
  return { rows: rows.map(toField), total: Number(n) };
}

export async function getField(farmId: string, id: string): Promise<Field | undefined> {
  const row = (await db("fields").where({ id, farm_id: farmId }).first()) as Row | undefined;
  return row ? toField(row) : undefined;
}

export async function createField(farmId: string, userId: string, input: FieldCreate): Promise<{ field: Field; created: boolean }> {
  return db.transaction(async (trx) => {
    if (input.id) {
      const existing = (await trx("fields").where({ id: input.id }).first()) as Row | undefined;
      if (existing?.farm_id === farmId) return { field: toField(existing), created: false };
    }
    const boundary = input.boundary ?? null;
    const values: Values = {
      name: input.name,
      boundary,
      ...(boundary ? measured(boundary) : { areaHa: input.areaHa!, centroidLat: null, centroidLon: null }),
      soilId: input.soilId ?? null,
      slopePct: input.slopePct ?? null,
      irrigationSystemId: input.irrigationSystemId ?? null,
      gaugeId: input.gaugeId ?? null,
      curveNumber: input.curveNumber ?? null,
    };
    await checkReferences(trx, farmId, values);
    await checkNameFree(trx, farmId, values.name, null);
    const { row, created } = await insertOnce<Row>(
      trx,
      "fields",
      { ...(input.id ? { id: input.id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
      (r) => r.farm_id === farmId,
    );
    const field = toField(row);
    if (created) await audit({ farmId, userId, action: "create", entity: "field", entityId: field.id, after: field }, trx);
    return { field, created };
  });
}

export async function updateField(farmId: string, userId: string, id: string, patch: FieldPatch): Promise<Field | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = (await trx("fields").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return undefined;
    const before = toField(row);
    const boundary = patch.boundary === undefined ? before.boundary : patch.boundary;
    if (boundary && patch.areaHa !== undefined) {
      throw new AppError("invalid", "Some values are not valid.", { areaHa: "The area is computed from the field's boundary; change the boundary instead" });
    }
    const values: Values = {
      ...before,
      ...patch,
      boundary,
      ...(boundary
        ? measured(boundary)
        : { areaHa: patch.areaHa ?? before.areaHa, centroidLat: null, centroidLon: null }),
    };
    await checkReferences(trx, farmId, values, before);
    if (values.name !== before.name && !before.archivedAt) await checkNameFree(trx, farmId, values.name, id);
    const [updated] = (await trx("fields").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    let after = toField(updated!);
    await audit({ farmId, userId, action: "update", entity: "field", entityId: id, before, after }, trx);
    const changed = FIELD_ACCOUNT_KEYS.some((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]));
    const dirty = changed && (await markFieldsFromPlantings(trx, [id]));
    if (dirty) after = toField((await trx("fields").where({ id }).first()) as Row);
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}

/** Archives a field: off the map and lists, its accounts and records kept for the season statement. */
export async function archiveField(farmId: string, userId: string, id: string): Promise<boolean> {
  return db.transaction(async (trx) => {
    const row = (await trx("fields").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return false;
    if (row.archived_at) return true;
    const [updated] = (await trx("fields").where({ id }).update({ archived_at: trx.fn.now(), updated_by: userId }).returning("*")) as Row[];
    await audit({ farmId, userId, action: "archive", entity: "field", entityId: id, before: toField(row), after: toField(updated!) }, trx);
    return true;
  });
}

/** The earliest date any live field of a farm is marked stale from, with the farm's zone; null when none is. */
export async function earliestDirtyDate(farmId: string): Promise<{ from: string; timeZone: string } | null> {
  const row = (await db("fields as f")
    .join("farms as fa", "fa.id", "f.farm_id")
    .where("f.farm_id", farmId)
    .whereNull("f.archived_at")
    .groupBy("fa.time_zone")
    .first(db.raw("min(f.account_dirty_from)::text as from"), "fa.time_zone")) as { from: string | null; time_zone: string } | undefined;
  return row?.from ? { from: row.from, timeZone: row.time_zone } : null;
}
