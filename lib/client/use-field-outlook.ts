"use client";

import useSWR from "swr";
import { fetchJson } from "./fetcher";

export interface OutlookDayDto {
  date: string;
  etoMm: number;
  etoSource: "forecast" | "recent-mean";
  kc: number;
  etcAdjMm: number;
  rainCountedMm: number;
  effectiveRainMm: number;
  depletionStartMm: number;
  depletionEndMm: number;
  tawMm: number;
  triggerMm: number;
  ks: number;
}

export interface FieldOutlookDto {
  fieldId: string;
  lastAccountDate: string;
  systemId: string | null;
  days: OutlookDayDto[];
  triggerDate: string | null;
  dueNow: boolean;
  daysUntilTrigger: number | null;
  netDepthMm: number | null;
  grossDepthMm: number | null;
  grossVolumeM3: number | null;
  runTimeH: number | null;
  pivotPasses: number | null;
  meanEtoMm: number;
  estimate: true;
}

/** The field's account projected forward (409 while it has no stored account). */
export function useFieldOutlook(farmId: string, fieldId: string, days = 10) {
  return useSWR<FieldOutlookDto>(`/api/v1/farms/${farmId}/fields/${fieldId}/outlook?days=${days}`, fetchJson, { shouldRetryOnError: false });
}
