"use client";

import useSWR from "swr";
import { fetchJson } from "./fetcher";

export interface IrrigationSystemDto {
  id: string;
  name: string;
  kind: string;
  applicationEfficiency: number;
  flowM3H: number | null;
  capacityMmDay: number | null;
  depthPerPassMm: number | null;
  pumpName: string | null;
}

export function useSystems(farmId: string) {
  return useSWR<{ data: IrrigationSystemDto[] }>(`/api/v1/farms/${farmId}/systems?limit=1000`, fetchJson);
}
