import "server-only";
import { db } from "./knex";

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
