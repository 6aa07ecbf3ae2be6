"use client";

import useSWR from "swr";
import { fetchJson } from "./fetcher";

export interface StationDto {
  id: string;
  name: string;
  latitude: number | null;
  longitude: number | null;
  elevationM: number | null;
}

export interface WeatherDayDto {
  id: string;
  stationId: string;
  date: string;
  kind: "observed" | "forecast";
  tmaxC: number | null;
  tminC: number | null;
  rainMm: number | null;
  etoMm: number | null;
  flagged: boolean;
}

export function useStations(farmId: string) {
  return useSWR<{ data: StationDto[] }>(`/api/v1/farms/${farmId}/stations?limit=1000`, fetchJson);
}

/** Observed station days since `from` (oldest first), for each station's last reading. */
export function useRecentWeatherDays(farmId: string, from: string) {
  return useSWR<{ data: WeatherDayDto[] }>(`/api/v1/farms/${farmId}/weather-days?kind=observed&from=${from}&limit=1000`, fetchJson);
}
