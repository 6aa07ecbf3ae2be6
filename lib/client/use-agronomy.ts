"use client";

import useSWR from "swr";
import type { HistoryChange } from "@/lib/agronomy/versions";
import type { CropValues } from "@/lib/validation/crop";
import type { SoilValues } from "@/lib/validation/soil";
import { fetchJson } from "./fetcher";

/** A planting as the API returns it; null overrides mean "the crop's own value". */
export interface PlantingDto {
  id: string;
  fieldId: string;
  season: string;
  cropId: string;
  plantingDate: string;
  endDate: string | null;
  kcIni: number | null;
  kcMid: number | null;
  kcEnd: number | null;
  stageIniDays: number | null;
  stageDevDays: number | null;
  stageMidDays: number | null;
  stageLateDays: number | null;
  rootMinM: number | null;
  rootMaxM: number | null;
  p: number | null;
  mad: number | null;
  climateAdjust: boolean;
  kcScale: number | null;
  updatedAt: string;
}

/** A crop as the API answers it: the library's (farmId null) or a farm's own copy. */
export interface CropDto extends CropValues {
  id: string;
  farmId: string | null;
  library: boolean;
}

/** A soil as the API answers it: the library's (farmId null) or a farm's own copy. */
export interface SoilDto extends SoilValues {
  id: string;
  farmId: string | null;
  library: boolean;
}

export interface KcUsedDto {
  ini: number;
  mid: number;
  end: number;
  adjusted: boolean;
  midWindMs: number | null;
  midRhMinPct: number | null;
}

export interface PreviewDayDto {
  date: string;
  depletionMm: number;
  tawMm: number;
  rawMm: number;
  triggerMm: number;
  kc: number;
}

export interface CurvePreviewDto {
  from: string | null;
  to: string | null;
  saved: PreviewDayDto[];
  edited: PreviewDayDto[];
  kcUsed: { saved: KcUsedDto | null; edited: KcUsedDto | null };
  daysAtOrPastTrigger: { saved: number; edited: number };
}

export interface StatsDto {
  n: number;
  meanErrorMm: number | null;
  rmseMm: number | null;
  maeMm: number | null;
}

export interface CalibrationDto {
  kcScale: number;
  checks: {
    id: string;
    date: string;
    observedMm: number;
    modelledMm: number;
    errorMm: number;
    method: string;
    resetsAccount: boolean;
  }[];
  unmatched: number;
  stats: StatsDto;
  suggestion: { scale: number | null; withScale: StatsDto | null; evaluations: number; method: string };
}

export type HistoryEntryDto = HistoryChange & { actor: string; userEmail: string | null };

const base = (farmId: string) => `/api/v1/farms/${farmId}`;

export function usePlanting(farmId: string, plantingId: string | null) {
  return useSWR<{ planting: PlantingDto }>(
    plantingId ? `${base(farmId)}/plantings/${plantingId}` : null,
    fetchJson,
  );
}

export function useCrop(farmId: string, cropId: string | null) {
  return useSWR<{ crop: CropDto }>(cropId ? `${base(farmId)}/crops/${cropId}` : null, fetchJson);
}

export function useCrops(farmId: string) {
  return useSWR<{ data: CropDto[] }>(`${base(farmId)}/crops?limit=1000`, fetchJson);
}

export function useSoils(farmId: string) {
  return useSWR<{ data: SoilDto[] }>(`${base(farmId)}/soils?limit=1000`, fetchJson);
}

/** The audit history of a planting, farm crop or farm soil. */
export function useHistory(farmId: string, kind: "plantings" | "crops" | "soils", id: string | null) {
  return useSWR<{ data: HistoryEntryDto[] }>(id ? `${base(farmId)}/${kind}/${id}/history` : null, fetchJson);
}

export function useCalibration(farmId: string, plantingId: string | null) {
  return useSWR<CalibrationDto>(
    plantingId ? `${base(farmId)}/plantings/${plantingId}/calibration` : null,
    fetchJson,
    { revalidateOnFocus: false },
  );
}
