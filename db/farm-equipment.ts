import "server-only";
import type { Knex } from "knex";
import type { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { requestRecompute } from "@/lib/accounts/dirty";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

/**
 * A farm's equipment (rain gauge, weather station, irrigation system) as the app sees it: its own values
 * plus what every such table keeps. Archived items stay, so past accounts and events can still name them.
 */
export type Equipment<Values> = Values & {
  id: string;
  farmId: string;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
};

export type EquipmentRow = Record<string, unknown> & { id: string; farm_id: string; archived_at: Date | null };

export interface EquipmentSpec<Values extends { name: string }> {
  /** The table, e.g. "gauges". */
  table: string;
  /** The audit log's name for the entity, e.g. "weather_station". */
  entity: string;
  /** The app's name of each value and its column; the keys also fix the order of the values. */
  columns: Record<keyof Values, string>;
  /** Checks a whole set of values, on create and after a patch is laid over the stored ones. */
  schema: z.ZodType<Values>;
  /** Values a create may leave out; the create schema makes them optional, the full schema wants them. */
  createDefaults: Partial<Values>;
  /** What a farm reads when a second item in use takes a name already in use. */
  nameTaken: { message: string; field: string };
  /** Values that enter a field's account: changing one marks fields for recompute. */
  accountKeys: readonly (keyof Values)[];
  /** The fields whose accounts may draw on this item, so they are the ones marked when it changes. */
  fieldsUsing: (trx: Knex.Transaction, farmId: string, id: string) => Promise<string[]>;
}

/** Leaves out keys sent as undefined, so they do not overwrite a default. */
function defined<T extends object>(v: T): Partial<T> {
  return Object.fromEntries(Object.entries(v).filter(([, x]) => x !== undefined)) as Partial<T>;
}

/**
 * The queries shared by the farm's equipment tables. They differ only in their values, their words and
 * which fields an account change reaches, so each module passes those and keeps its own exported names.
 */
export function farmEquipment<Values extends { name: string }>(spec: EquipmentSpec<Values>) {
  const { table, entity, columns, schema } = spec;
  const keys = Object.keys(columns) as (keyof Values)[];

  function toItem(r: EquipmentRow): Equipment<Values> {
    const values = Object.fromEntries(keys.map((k) => [k, r[columns[k]] ?? null])) as Values;
    return {
      id: r.id,
      farmId: r.farm_id,
      ...values,
      archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
      createdAt: (r.created_at as Date).toISOString(),
      updatedAt: (r.updated_at as Date).toISOString(),
    };
  }

  function toColumns(v: Values): Record<string, unknown> {
    return Object.fromEntries(keys.map((k) => [columns[k], v[k]]));
  }

  function valuesOf(item: Equipment<Values>): Values {
    return Object.fromEntries(keys.map((k) => [k, item[k]])) as unknown as Values;
  }

  async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
    const taken = await trx(table)
      .where({ farm_id: farmId, name })
      .whereNull("archived_at")
      .modify((q) => {
        if (exceptId) q.whereNot("id", exceptId);
      })
      .first("id");
    if (taken) throw new AppError("conflict", spec.nameTaken.message, { name: spec.nameTaken.field });
  }

  async function list(farmId: string, page: PageQuery, includeArchived = false): Promise<{ rows: Equipment<Values>[]; total: number }> {
    const base = db(table)
      .where({ farm_id: farmId })
      .modify((q) => {
        if (!includeArchived) q.whereNull("archived_at");
      });
    const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
    const rows = (await base.clone().orderBy(["name", "id"]).limit(page.limit).offset(page.offset).select("*")) as EquipmentRow[];
    return { rows: rows.map(toItem), total: Number(n) };
  }

  async function get(farmId: string, id: string): Promise<Equipment<Values> | undefined> {
    const row = (await db(table).where({ id, farm_id: farmId }).first()) as EquipmentRow | undefined;
    return row ? toItem(row) : undefined;
  }

  async function create(
    farmId: string,
    userId: string,
    input: Partial<Values> & { id?: string },
  ): Promise<{ item: Equipment<Values>; created: boolean }> {
    const { id, ...given } = input;
    const values = schema.parse({ ...spec.createDefaults, ...defined(given) });
    return db.transaction(async (trx) => {
      if (id) {
        // The same client id sent again (an offline entry retried) answers with what it made the first time.
        const existing = (await trx(table).where({ id }).first()) as EquipmentRow | undefined;
        if (existing?.farm_id === farmId) return { item: toItem(existing), created: false };
      }
      await checkNameFree(trx, farmId, values.name, null);
      const { row, created } = await insertOnce<EquipmentRow>(
        trx,
        table,
        { ...(id ? { id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
        (r) => r.farm_id === farmId,
      );
      const item = toItem(row);
      if (created) await audit({ farmId, userId, action: "create", entity, entityId: item.id, after: item }, trx);
      return { item, created };
    });
  }

  async function update(farmId: string, userId: string, id: string, patch: Partial<Values>): Promise<Equipment<Values> | undefined> {
    const result = await db.transaction(async (trx) => {
      const row = (await trx(table).where({ id, farm_id: farmId }).forUpdate().first()) as EquipmentRow | undefined;
      if (!row) return undefined;
      const before = toItem(row);
      const values = schema.parse({ ...valuesOf(before), ...patch });
      // An archived item's name is free for others, so renaming it needs no check.
      if (values.name !== before.name && !before.archivedAt) await checkNameFree(trx, farmId, values.name, id);
      const [updated] = (await trx(table).where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as EquipmentRow[];
      const after = toItem(updated!);
      await audit({ farmId, userId, action: "update", entity, entityId: id, before, after }, trx);
      let dirty = false;
      if (spec.accountKeys.some((k) => before[k] !== after[k])) {
        dirty = await markFieldsFromPlantings(trx, await spec.fieldsUsing(trx, farmId, id));
      }
      return { after, dirty };
    });
    // Asked for after the commit, so the recompute reads the new values.
    if (result?.dirty) await requestRecompute(farmId);
    return result?.after;
  }

  async function archive(farmId: string, userId: string, id: string): Promise<boolean> {
    return db.transaction(async (trx) => {
      const row = (await trx(table).where({ id, farm_id: farmId }).forUpdate().first()) as EquipmentRow | undefined;
      if (!row) return false;
      if (row.archived_at) return true;
      const [updated] = (await trx(table).where({ id }).update({ archived_at: trx.fn.now(), updated_by: userId }).returning("*")) as EquipmentRow[];
      await audit({ farmId, userId, action: "archive", entity, entityId: id, before: toItem(row), after: toItem(updated!) }, trx);
      return true;
    });
  }

  return { toItem, list, get, create, update, archive };
}
