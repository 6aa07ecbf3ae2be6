import "server-only";
import {
  irrigationSystemSchema,
  SYSTEM_ACCOUNT_KEYS,
  type IrrigationSystemCreate,
  type IrrigationSystemValues,
} from "@/lib/validation/irrigation-system";
import { farmEquipment, type Equipment } from "./farm-equipment";

export type IrrigationSystem = Equipment<IrrigationSystemValues>;

const systems = farmEquipment<IrrigationSystemValues>({
  table: "irrigation_systems",
  entity: "irrigation_system",
  columns: {
    name: "name",
    kind: "kind",
    applicationEfficiency: "application_efficiency",
    flowM3H: "flow_m3_h",
    capacityMmDay: "capacity_mm_day",
    depthPerPassMm: "depth_per_pass_mm",
    pumpName: "pump_name",
  },
  schema: irrigationSystemSchema,
  createDefaults: { flowM3H: null, capacityMmDay: null, depthPerPassMm: null, pumpName: null },
  nameTaken: { message: "This farm already has a system with that name.", field: "Already used by another system on this farm" },
  accountKeys: SYSTEM_ACCOUNT_KEYS,
  // Only the fields watered by this system count its efficiency.
  fieldsUsing: (trx, farmId, id) => trx("fields").where({ farm_id: farmId, irrigation_system_id: id }).pluck("id"),
});

export const toIrrigationSystem = systems.toItem;

/** The farm's systems in use, by name; archived ones only when asked for. */
export const listIrrigationSystems = systems.list;

export const getIrrigationSystem = systems.get;

export async function createIrrigationSystem(
  farmId: string,
  userId: string,
  input: IrrigationSystemCreate,
): Promise<{ system: IrrigationSystem; created: boolean }> {
  const { item, created } = await systems.create(farmId, userId, input);
  return { system: item, created };
}

export const updateIrrigationSystem = systems.update;

/**
 * Archives a system: kept, so past irrigation events still name it, but off the lists. Fields that still
 * use it keep it until someone picks another.
 */
export const archiveIrrigationSystem = systems.archive;
