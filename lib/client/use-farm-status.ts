"use client";

import useSWR from "swr";
import { fetchJson } from "./fetcher";

/** The API's status bands (GET /status); the map shows its own five bands built from them. */
export type ApiStatusBand = "stressed" | "due" | "drying" | "comfortable" | "no-account";

export interface FieldStatusDto {
  id: string;
  name: string;
  depletionMm: number | null;
  tawMm: number | null;
  rawMm: number | null;
  triggerMm: number | null;
  daysUntilTrigger: number | null;
  band: ApiStatusBand;
  lastAccountDate: string | null;
  dirty: boolean;
  dirtyFrom: string | null;
}

export function useFarmStatus(farmId: string) {
  return useSWR<{ data: FieldStatusDto[] }>(`/api/v1/farms/${farmId}/status`, fetchJson);
}
