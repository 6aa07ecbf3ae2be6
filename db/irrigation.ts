import "server-only";
import type { Knex } from "knex";
import { markFieldsDirty } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { insertOnce } from "@/lib/api/idempotent";
import type { PageQuery } from "@/lib/api/pagination";
import type { Author } from "@/lib/auth/api-tokens";
import { farmToday } from "@/lib/farm-time";
import {
  irrigationAmounts,
  irrigationEventSchema,
  QUANTITY_KEYS,
  type IrrigationEventInput,
  type IrrigationEventPatch,
} from "@/lib/validation/irrigation";
import { audit } from "./audit";
import { db } from "./knex";
import { requireFarm } from "./rain";

export interface IrrigationEvent {
  id: string;
  fieldId: string;
  systemId: string | null;
  startedAt: string;
  endedAt: string | null;
  date: string;
  method: IrrigationEventInput["method"];
  grossDepthMm: number;
  netDepthMm: number | null;
  volumeM3: number | null;
  hours: number | null;
  meterStart: number | null;
  meterEnd: number | null;
  note: string | null;
}

interface IrrigationEventRow {
  id: string;
  field_id: string;
  system_id: string | null;
  started_at: Date;
  ended_at: Date | null;
  date: string;
  method: IrrigationEventInput["method"];
  gross_depth_mm: number;
  net_depth_mm: number | null;
  volume_m3: number | null;
  hours: number | null;
  meter_start: number | null;
  meter_end: number | null;
  note: string | null;
}

export function toIrrigationEvent(r: IrrigationEventRow): IrrigationEvent {
  return {
    id: r.id,
    fieldId: r.field_id,
    systemId: r.system_id,
    startedAt: new Date(r.started_at).toISOString(),
    endedAt: r.ended_at ? new Date(r.ended_at).toISOString() : null,
    date: r.date,
    method: r.method,
    grossDepthMm: r.gross_depth_mm,
    netDepthMm: r.net_depth_mm,
    volumeM3: r.volume_m3,
    hours: r.hours,
    meterStart: r.meter_start,
    meterEnd: r.meter_end,
    note: r.note,
  };
}

interface FieldOfFarm {
  id: string;
  areaHa: number;
  systemId: string | null;
}

/** The farm's field, or a 404 naming `fieldId` (another farm's field looks absent). */
export async function requireField(farmId: string, fieldId: string, trx: Knex = db): Promise<FieldOfFarm> {
  const row = (await trx("fields").where({ id: fieldId, farm_id: farmId }).first("id", "area_ha", "irrigation_system_id")) as
    | { id: string; area_ha: number; irrigation_system_id: string | null }
    | undefined;
  if (!row) throw new AppError("not_found", "No such field on this farm.", { fieldId: "No such field on this farm" });
  return { id: row.id, areaHa: row.area_ha, systemId: row.irrigation_system_id };
}

async function systemOfFarm(farmId: string, systemId: string | null): Promise<{ efficiency: number | null; flowM3H: number | null }> {
  if (!systemId) return { efficiency: null, flowM3H: null };
  const row = (await db("irrigation_systems").where({ id: systemId, farm_id: farmId }).first("application_efficiency", "flow_m3_h")) as
    | { application_efficiency: number; flow_m3_h: number | null }
    | undefined;
  if (!row) throw new AppError("not_found", "No such irrigation system on this farm.", { systemId: "No such irrigation system on this farm" });
  return { efficiency: row.application_efficiency, flowM3H: row.flow_m3_h };
}

/** The row to store for an event: amounts from the field and system, the local date from the start. */
async function eventColumns(farmId: string, input: IrrigationEventInput): Promise<Record<string, unknown>> {
  const farm = await requireFarm(farmId);
  const field = await requireField(farmId, input.fieldId);
  const systemId = input.systemId === undefined ? field.systemId : input.systemId;
  const system = await systemOfFarm(farmId, systemId);
  const amounts = irrigationAmounts(input, field.areaHa, system.efficiency, system.flowM3H);
  return {
    field_id: field.id,
    system_id: systemId,
    started_at: input.startedAt,
    ended_at: input.endedAt ?? null,
    date: farmToday(farm.timeZone, new Date(input.startedAt)),
    method: input.method,
    gross_depth_mm: amounts.grossDepthMm,
    net_depth_mm: amounts.netDepthMm,
    volume_m3: amounts.volumeM3,
    hours: input.method === "hours" ? input.hours : null,
    meter_start: input.method === "meter" ? input.meterStart : null,
    meter_end: input.method === "meter" ? input.meterEnd : null,
    note: input.note ?? null,
  };
}

async function eventRow(farmId: string, id: string, trx: Knex = db): Promise<IrrigationEventRow | undefined> {
  return (await trx("irrigation_events as e").join("fields as f", "f.id", "e.field_id").where({ "f.farm_id": farmId, "e.id": id }).first("e.*")) as
    | IrrigationEventRow
    | undefined;
}

export async function createIrrigationEvent(farmId: string, author: Author, input: IrrigationEventInput): Promise<{ event: IrrigationEvent; created: boolean }> {
  const columns = await eventColumns(farmId, input);
  return db.transaction(async (trx) => {
    const row = { ...(input.id ? { id: input.id } : {}), ...columns, created_by: author.userId, updated_by: author.userId };
    const result = await insertOnce<IrrigationEventRow>(trx, "irrigation_events", row, async (e) => (await eventRow(farmId, e.id, trx)) !== undefined);
    const event = toIrrigationEvent(result.row);
    if (result.created) {
      await audit({ farmId, userId: author.userId, actor: author.actor, action: "create", entity: "irrigation_event", entityId: event.id, after: event }, trx);
      await markFieldsDirty(trx, { fieldIds: [event.fieldId] }, event.date);
    }
    return { event, created: result.created };
  });
}

/** The stored event as the inputs it was logged with, so a correction can be checked like a new entry. */
function asInput(e: IrrigationEvent): IrrigationEventInput {
  const quantities =
    e.method === "depth"
      ? { grossDepthMm: e.grossDepthMm }
      : e.method === "volume"
        ? { volumeM3: e.volumeM3 ?? 0 }
        : e.method === "hours"
          ? { hours: e.hours ?? 0 }
          : { meterStart: e.meterStart ?? 0, meterEnd: e.meterEnd ?? 0 };
  return { fieldId: e.fieldId, systemId: e.systemId, startedAt: e.startedAt, endedAt: e.endedAt, method: e.method, note: e.note, ...quantities };
}

/** Corrects an event: the stored inputs with the patch laid over them, amounts worked out again. */
export async function updateIrrigationEvent(farmId: string, author: Author, id: string, patch: IrrigationEventPatch): Promise<IrrigationEvent> {
  const existing = await eventRow(farmId, id);
  if (!existing) throw new AppError("not_found", "No such irrigation event.");
  const before = toIrrigationEvent(existing);
  const { reason, ...changes } = patch;
  const stored: Record<string, unknown> = { ...asInput(before) };
  // New quantities replace all the old ones, so a switch from hours to volume leaves no stale hours.
  if (QUANTITY_KEYS.some((k) => changes[k] !== undefined) || changes.method !== undefined) for (const k of QUANTITY_KEYS) delete stored[k];
  const input = irrigationEventSchema.parse({ ...stored, ...changes });
  const columns = await eventColumns(farmId, input);
  return db.transaction(async (trx) => {
    const [row] = (await trx("irrigation_events").where({ id }).update({ ...columns, updated_by: author.userId }).returning("*")) as IrrigationEventRow[];
    const after = toIrrigationEvent(row!);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "update", entity: "irrigation_event", entityId: id, before, after, reason }, trx);
    await markFieldsDirty(trx, { fieldIds: [after.fieldId] }, before.date < after.date ? before.date : after.date);
    return after;
  });
}

export async function deleteIrrigationEvent(farmId: string, author: Author, id: string): Promise<void> {
  await db.transaction(async (trx) => {
    const existing = await eventRow(farmId, id, trx);
    if (!existing) throw new AppError("not_found", "No such irrigation event.");
    await trx("irrigation_events").where({ id }).delete();
    const before = toIrrigationEvent(existing);
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "delete", entity: "irrigation_event", entityId: id, before }, trx);
    await markFieldsDirty(trx, { fieldIds: [before.fieldId] }, before.date);
  });
}

export async function getIrrigationEvent(farmId: string, id: string): Promise<IrrigationEvent | undefined> {
  const row = await eventRow(farmId, id);
  return row ? toIrrigationEvent(row) : undefined;
}

export async function listIrrigationEvents(
  farmId: string,
  filter: { fieldId?: string; from?: string; to?: string },
  page: PageQuery,
): Promise<{ rows: IrrigationEvent[]; total: number }> {
  const q = db("irrigation_events as e").join("fields as f", "f.id", "e.field_id").where("f.farm_id", farmId);
  if (filter.fieldId) q.where("e.field_id", filter.fieldId);
  if (filter.from) q.where("e.date", ">=", filter.from);
  if (filter.to) q.where("e.date", "<=", filter.to);
  const [count] = (await q.clone().count("* as count")) as { count: string | number }[];
  const rows = (await q.select("e.*").orderBy([{ column: "e.started_at", order: "desc" }]).limit(page.limit).offset(page.offset)) as IrrigationEventRow[];
  return { rows: rows.map(toIrrigationEvent), total: Number(count?.count ?? 0) };
}
