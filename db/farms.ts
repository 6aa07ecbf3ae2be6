import "server-only";
import { requestRecompute } from "@/lib/accounts/dirty";
import type { FarmPatch } from "@/lib/validation/farm";
import { audit } from "./audit";
import { db } from "./knex";
import { markFieldsFromPlantings } from "./plantings";

export interface Farm {
  id: string;
  name: string;
  timeZone: string;
  unitSystem: "metric" | "imperial";
  latitude: number | null;
  longitude: number | null;
  elevationM: number | null;
  rainDayBoundaryHour: number;
  allocationMl: number | null;
  carryoverMl: number;
  waterYearStartMonth: number;
  countFlaggedValues: boolean;
}

interface FarmRow {
  id: string;
  name: string;
  time_zone: string;
  unit_system: "metric" | "imperial";
  latitude: number | null;
  longitude: number | null;
  elevation_m: number | null;
  rain_day_boundary_hour: number;
  allocation_ml: number | null;
  carryover_ml: number | null;
  water_year_start_month: number;
  count_flagged_values: boolean;
}

export function toFarm(r: FarmRow): Farm {
  return {
    id: r.id,
    name: r.name,
    timeZone: r.time_zone,
    unitSystem: r.unit_system,
    latitude: r.latitude,
    longitude: r.longitude,
    elevationM: r.elevation_m,
    rainDayBoundaryHour: r.rain_day_boundary_hour,
    allocationMl: r.allocation_ml,
    carryoverMl: r.carryover_ml ?? 0,
    waterYearStartMonth: r.water_year_start_month,
    countFlaggedValues: r.count_flagged_values,
  };
}

export async function getFarm(id: string): Promise<Farm | undefined> {
  const row = await db<FarmRow>("farms").where({ id }).first();
  return row ? toFarm(row) : undefined;
}

const FARM_COLUMNS: Record<keyof FarmPatch, keyof FarmRow> = {
  name: "name",
  timeZone: "time_zone",
  unitSystem: "unit_system",
  latitude: "latitude",
  longitude: "longitude",
  elevationM: "elevation_m",
  rainDayBoundaryHour: "rain_day_boundary_hour",
  countFlaggedValues: "count_flagged_values",
  allocationMl: "allocation_ml",
  carryoverMl: "carryover_ml",
  waterYearStartMonth: "water_year_start_month",
};

/**
 * Settings the account is computed from: the zone and boundary hour decide which local day rain and
 * weather belong to; flagged values are in or out of it; the location stands in for a station's.
 */
const FARM_ACCOUNT_KEYS: readonly (keyof FarmPatch)[] = [
  "timeZone",
  "rainDayBoundaryHour",
  "countFlaggedValues",
  "latitude",
  "longitude",
  "elevationM",
];

/**
 * Changes a farm's settings (the caller has checked the role may change each part), audited, and marks
 * every field's account stale from its earliest planting when an input of the account changed.
 */
export async function updateFarm(farmId: string, userId: string, patch: FarmPatch): Promise<Farm | undefined> {
  const result = await db.transaction(async (trx) => {
    const row = await trx<FarmRow>("farms").where({ id: farmId }).forUpdate().first();
    if (!row) return undefined;
    const before = toFarm(row);
    const columns: Record<string, unknown> = { updated_by: userId };
    for (const [key, value] of Object.entries(patch)) {
      if (value !== undefined) columns[FARM_COLUMNS[key as keyof FarmPatch]] = value;
    }
    const [updated] = (await trx("farms").where({ id: farmId }).update(columns).returning("*")) as FarmRow[];
    const after = toFarm(updated!);
    await audit({ farmId, userId, action: "update", entity: "farm", entityId: farmId, before, after }, trx);
    let dirty = false;
    if (FARM_ACCOUNT_KEYS.some((k) => before[k] !== after[k])) {
      const fieldIds = (await trx("fields").where({ farm_id: farmId }).pluck("id")) as string[];
      dirty = await markFieldsFromPlantings(trx, fieldIds);
    }
    return { after, dirty };
  });
  if (result?.dirty) await requestRecompute(farmId);
  return result?.after;
}
