import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { requestRecompute } from "@/lib/accounts/dirty";
import {
  irrigationSystemSchema,
  irrigationSystemShape,
  SYSTEM_ACCOUNT_KEYS,
  type IrrigationSystemCreate,
  type IrrigationSystemPatch,
  type IrrigationSystemValues,
} from "@/lib/validation/irrigation-system";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

export interface IrrigationSystem extends IrrigationSystemValues {
  id: string;
  farmId: string;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

const COLUMNS: Record<keyof IrrigationSystemValues, string> = {
  name: "name",
  kind: "kind",
  applicationEfficiency: "application_efficiency",
  flowM3H: "flow_m3_h",
  capacityMmDay: "capacity_mm_day",
  depthPerPassMm: "depth_per_pass_mm",
  pumpName: "pump_name",
};
const KEYS = Object.keys(irrigationSystemShape) as (keyof IrrigationSystemValues)[];

type Row = Record<string, unknown> & { id: string; farm_id: string; archived_at: Date | null };

export function toIrrigationSystem(r: Row): IrrigationSystem {
  const values = Object.fromEntries(KEYS.map((k) => [k, r[COLUMNS[k]] ?? null])) as unknown as IrrigationSystemValues;
  return {
    id: r.id,
    farmId: r.farm_id,
    ...values,
    archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
    createdAt: (r.created_at as Date).toISOString(),
    updatedAt: (r.updated_at as Date).toISOString(),
  };
}

function toColumns(v: IrrigationSystemValues): Record<string, unknown> {
  return Object.fromEntries(KEYS.map((k) => [COLUMNS[k], v[k]]));
}

function valuesOf(s: IrrigationSystem): IrrigationSystemValues {
  return Object.fromEntries(KEYS.map((k) => [k, s[k]])) as unknown as IrrigationSystemValues;
}

/** Leaves out keys sent as undefined, so they do not overwrite a default. */
function defined<T extends object>(v: T): Partial<T> {
  return Object.fromEntries(Object.entries(v).filter(([, x]) => x !== undefined)) as Partial<T>;
}

/** The farm's systems in use, by name; archived ones only when asked for. */
export async function listIrrigationSystems(farmId: string, page: PageQuery, includeArchived = false): Promise<{ rows: IrrigationSystem[]; total: number }> {
  const base = db("irrigation_systems")
    .where({ farm_id: farmId })
    .modify((q) => {
      if (!includeArchived) q.whereNull("archived_at");
    });
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base.clone().orderBy(["name", "id"]).limit(page.limit).offset(page.offset).select("*")) as Row[];
  return { rows: rows.map(toIrrigationSystem), total: Number(n) };
}

export async function getIrrigationSystem(farmId: string, id: string): Promise<IrrigationSystem | undefined> {
  const row = (await db("irrigation_systems").where({ id, farm_id: farmId }).first()) as Row | undefined;
  return row ? toIrrigationSystem(row) : undefined;
}

async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
  const taken = await trx("irrigation_systems")
    .where({ farm_id: farmId, name })
    .whereNull("archived_at")
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .first("id");
  if (taken) throw new AppError("conflict", "This farm already has a system with that name.", { name: "Already used by another system on this farm" });
}

export async function createIrrigationSystem(farmId: string, userId: string, input: IrrigationSystemCreate): Promise<{ system: IrrigationSystem; created: boolean }> {
  const { id, ...given } = input;
  const values = irrigationSystemSchema.parse({ flowM3H: null, capacityMmDay: null, depthPerPassMm: null, pumpName: null, ...defined(given) });
  return db.transaction(async (trx) => {
    if (id) {
      const existing = (await trx("irrigation_systems").where({ id }).first()) as Row | undefined;
      if (existing?.farm_id === farmId) return { system: toIrrigationSystem(existing), created: false };
    }
    await checkNameFree(trx, farmId, values.name, null);
    const { row, created } = await insertOnce<Row>(
      trx,
      "irrigation_systems",
      { ...(id ? { id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
      (r) => r.farm_id === farmId,
    );
    const system = toIrrigationSystem(row);
    if (created) await audit({ farmId, userId, action: "create", entity: "irrigation_system", entityId: system.id, after: system }, trx);
    return { system, created };
  });
}

export async function updateIrrigationSystem(farmId: string, userId: string, id: string, patch: IrrigationSystemPatch): Promise<IrrigationSystem | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = (await trx("irrigation_systems").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return undefined;
    const before = toIrrigationSystem(row);
    const values = irrigationSystemSchema.parse({ ...valuesOf(before), ...patch });
    if (values.name !== before.name && !before.archivedAt) await checkNameFree(trx, farmId, values.name, id);
    const [updated] = (await trx("irrigation_systems").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    const after = toIrrigationSystem(updated!);
    await audit({ farmId, userId, action: "update", entity: "irrigation_system", entityId: id, before, after }, trx);
    let dirty = false;
    if (SYSTEM_ACCOUNT_KEYS.some((k) => before[k] !== after[k])) {
      const fieldIds = (await trx("fields").where({ farm_id: farmId, irrigation_system_id: id }).pluck("id")) as string[];
      dirty = await markFieldsFromPlantings(trx, fieldIds);
    }
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}

/**
 * Archives a system: kept, so past irrigation events still name it, but off the lists. Fields that still
 * use it keep it until someone picks another.
 */
export async function archiveIrrigationSystem(farmId: string, userId: string, id: string): Promise<boolean> {
  return db.transaction(async (trx) => {
    const row = (await trx("irrigation_systems").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return false;
    if (row.archived_at) return true;
    const [updated] = (await trx("irrigation_systems").where({ id }).update({ archived_at: trx.fn.now(), updated_by: userId }).returning("*")) as Row[];
    await audit({ farmId, userId, action: "archive", entity: "irrigation_system", entityId: id, before: toIrrigationSystem(row), after: toIrrigationSystem(updated!) }, trx);
    return true;
  });
}
