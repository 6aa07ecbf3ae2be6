"use client";

import useSWR from "swr";
import { fetchJson } from "./fetcher";

export interface PlannedIrrigationDto {
  fieldId: string;
  rank: number;
  dueDate: string;
  grossDepthMm: number;
  volumeM3: number;
  startDate: string | null;
  endDate: string | null;
  lateDays: number;
  unplacedM3: number;
  allocations: { date: string; volumeM3: number }[];
}

export interface ShortfallDayDto {
  date: string;
  backlogM3: number;
  fieldIds: string[];
  saturatedGroupIds: string[];
}

export interface FarmPlanDto {
  startDate: string;
  days: number;
  irrigations: PlannedIrrigationDto[];
  notDue: string[];
  shortfallDays: ShortfallDayDto[];
  capacities: { id: string; m3PerDay?: number }[];
  estimate: true;
}

/** The farm's irrigations over the next `days` days, within shared pump and system capacity. */
export function usePlan(farmId: string, days = 7) {
  return useSWR<FarmPlanDto>(`/api/v1/farms/${farmId}/plan?days=${days}`, fetchJson);
}
