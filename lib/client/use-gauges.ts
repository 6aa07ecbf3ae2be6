"use client";

import useSWR from "swr";
import { fetchJson } from "./fetcher";

export interface GaugeDto {
  id: string;
  name: string;
  kind: "manual" | "recording";
  latitude: number | null;
  longitude: number | null;
}

export interface RainReadingDto {
  id: string;
  gaugeId: string;
  readAt: string;
  rainDate: string;
  depthMm: number;
  trace: boolean;
  flagged: boolean;
}

export function useGauges(farmId: string) {
  return useSWR<{ data: GaugeDto[] }>(`/api/v1/farms/${farmId}/gauges?limit=1000`, fetchJson);
}

/** The farm's readings since `from` (newest day first), for each gauge's last reading. */
export function useRecentRainReadings(farmId: string, from: string) {
  return useSWR<{ data: RainReadingDto[] }>(`/api/v1/farms/${farmId}/rain-readings?from=${from}&limit=1000`, fetchJson);
}
