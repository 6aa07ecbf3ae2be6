import "server-only";
import type { Knex } from "knex";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import { requestRecompute } from "@/lib/accounts/dirty";
import {
  GAUGE_ACCOUNT_KEYS,
  gaugeSchema,
  gaugeShape,
  type GaugeCreate,
  type GaugePatch,
  type GaugeValues,
} from "@/lib/validation/gauge";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

export interface Gauge extends GaugeValues {
  id: string;
  farmId: string;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

const COLUMNS: Record<keyof GaugeValues, string> = {
  name: "name",
  kind: "kind",
  latitude: "latitude",
  longitude: "longitude",
  resolutionMm: "resolution_mm",
};
const KEYS = Object.keys(gaugeShape) as (keyof GaugeValues)[];

type Row = Record<string, unknown> & { id: string; farm_id: string; archived_at: Date | null };

export function toGauge(r: Row): Gauge {
  const values = Object.fromEntries(KEYS.map((k) => [k, r[COLUMNS[k]] ?? null])) as unknown as GaugeValues;
  return {
    id: r.id,
    farmId: r.farm_id,
    ...values,
    archivedAt: r.archived_at ? r.archived_at.toISOString() : null,
    createdAt: (r.created_at as Date).toISOString(),
    updatedAt: (r.updated_at as Date).toISOString(),
  };
}

function toColumns(v: GaugeValues): Record<string, unknown> {
  return Object.fromEntries(KEYS.map((k) => [COLUMNS[k], v[k]]));
}

function valuesOf(s: Gauge): GaugeValues {
  return Object.fromEntries(KEYS.map((k) => [k, s[k]])) as unknown as GaugeValues;
}

/** Leaves out keys sent as undefined, so they do not overwrite a default. */
function defined<T extends object>(v: T): Partial<T> {
  return Object.fromEntries(Object.entries(v).filter(([, x]) => x !== undefined)) as Partial<T>;
}

/** The farm's gauges in use, by name; archived ones only when asked for. */
export async function listGauges(farmId: string, page: PageQuery, includeArchived = false): Promise<{ rows: Gauge[]; total: number }> {
  const base = db("gauges")
    .where({ farm_id: farmId })
    .modify((q) => {
      if (!includeArchived) q.whereNull("archived_at");
    });
  const [{ n }] = (await base.clone().count({ n: "*" })) as [{ n: number }];
  const rows = (await base.clone().orderBy(["name", "id"]).limit(page.limit).offset(page.offset).select("*")) as Row[];
  return { rows: rows.map(toGauge), total: Number(n) };
}

export async function getGauge(farmId: string, id: string): Promise<Gauge | undefined> {
  const row = (await db("gauges").where({ id, farm_id: farmId }).first()) as Row | undefined;
  return row ? toGauge(row) : undefined;
}

async function checkNameFree(trx: Knex.Transaction, farmId: string, name: string, exceptId: string | null): Promise<void> {
  const taken = await trx("gauges")
    .where({ farm_id: farmId, name })
    .whereNull("archived_at")
    .modify((q) => {
      if (exceptId) q.whereNot("id", exceptId);
    })
    .first("id");
  if (taken) throw new AppError("conflict", "This farm already has a gauge with that name.", { name: "Already used by another gauge on this farm" });
}

export async function createGauge(farmId: string, userId: string, input: GaugeCreate): Promise<{ gauge: Gauge; created: boolean }> {
  const { id, ...given } = input;
  const values = gaugeSchema.parse({ latitude: null, longitude: null, resolutionMm: null, ...defined(given) });
  return db.transaction(async (trx) => {
    if (id) {
      const existing = (await trx("gauges").where({ id }).first()) as Row | undefined;
      if (existing?.farm_id === farmId) return { gauge: toGauge(existing), created: false };
    }
    await checkNameFree(trx, farmId, values.name, null);
    const { row, created } = await insertOnce<Row>(
      trx,
      "gauges",
      { ...(id ? { id } : {}), farm_id: farmId, ...toColumns(values), created_by: userId, updated_by: userId },
      (r) => r.farm_id === farmId,
    );
    const gauge = toGauge(row);
    if (created) await audit({ farmId, userId, action: "create", entity: "gauge", entityId: gauge.id, after: gauge }, trx);
    return { gauge, created };
  });
}

export async function updateGauge(farmId: string, userId: string, id: string, patch: GaugePatch): Promise<Gauge | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = (await trx("gauges").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return undefined;
    const before = toGauge(row);
    const values = gaugeSchema.parse({ ...valuesOf(before), ...patch });
    if (values.name !== before.name && !before.archivedAt) await checkNameFree(trx, farmId, values.name, id);
    const [updated] = (await trx("gauges").where({ id }).update({ ...toColumns(values), updated_by: userId }).returning("*")) as Row[];
    const after = toGauge(updated!);
    await audit({ farmId, userId, action: "update", entity: "gauge", entityId: id, before, after }, trx);
    let dirty = false;
    if (GAUGE_ACCOUNT_KEYS.some((k) => before[k] !== after[k])) {
      // Rain is shared between gauges by distance, so any field of the farm may draw on this one.
      const fieldIds = (await trx("fields").where({ farm_id: farmId }).pluck("id")) as string[];
      dirty = await markFieldsFromPlantings(trx, fieldIds);
    }
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}

/** Archives a gauge: its readings stay part of past accounts; fields that name it keep it until changed. */
export async function archiveGauge(farmId: string, userId: string, id: string): Promise<boolean> {
  return db.transaction(async (trx) => {
    const row = (await trx("gauges").where({ id, farm_id: farmId }).forUpdate().first()) as Row | undefined;
    if (!row) return false;
    if (row.archived_at) return true;
    const [updated] = (await trx("gauges").where({ id }).update({ archived_at: trx.fn.now(), updated_by: userId }).returning("*")) as Row[];
    await audit({ farmId, userId, action: "archive", entity: "gauge", entityId: id, before: toGauge(row), after: toGauge(updated!) }, trx);
    return true;
  });
}
