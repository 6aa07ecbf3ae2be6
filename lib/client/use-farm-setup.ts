"use client";

import useSWR from "swr";
import type { Boundary } from "@/lib/geo/boundary";
import type { GaugeValues } from "@/lib/validation/gauge";
import type { IrrigationSystemValues } from "@/lib/validation/irrigation-system";
import type { WeatherStationValues } from "@/lib/validation/weather-station";
import { fetchJson } from "./fetcher";

interface Row {
  id: string;
  archivedAt: string | null;
}

export type GaugeDto = GaugeValues & Row;
export type SystemDto = IrrigationSystemValues & Row;
export type StationDto = WeatherStationValues & Row;

export interface FieldDto extends Row {
  name: string;
  boundary: Boundary | null;
  areaHa: number;
  centroidLat: number | null;
  centroidLon: number | null;
  soilId: string | null;
  slopePct: number | null;
  irrigationSystemId: string | null;
  gaugeId: string | null;
}

export interface SoilDto {
  id: string;
  name: string;
  library: boolean;
}

export interface ListOf<T> {
  data: T[];
}

// The lists are small (a farm's gauges, fields, systems); one page of 1000 holds them all.
const url = (farmId: string, what: string) => `/api/v1/farms/${farmId}/${what}?limit=1000`;

/** The keys the set-up screens revalidate after a change. */
export const setupKeys = {
  gauges: (farmId: string) => url(farmId, "gauges"),
  fields: (farmId: string) => url(farmId, "fields"),
  systems: (farmId: string) => url(farmId, "systems"),
  stations: (farmId: string) => url(farmId, "stations"),
  soils: (farmId: string) => url(farmId, "soils"),
};

/*
 * The page renders the lists on the server and hands them in as fallback data, so the log page keeps
 * working from the cached page when the phone is offline (SWR keeps the fallback when a refresh fails).
 */
export function useGauges(farmId: string, fallbackData?: ListOf<GaugeDto>) {
  return useSWR<ListOf<GaugeDto>>(setupKeys.gauges(farmId), fetchJson, { fallbackData });
}

export function useFields(farmId: string, fallbackData?: ListOf<FieldDto>) {
  return useSWR<ListOf<FieldDto>>(setupKeys.fields(farmId), fetchJson, { fallbackData });
}

export function useSystems(farmId: string, fallbackData?: ListOf<SystemDto>) {
  return useSWR<ListOf<SystemDto>>(setupKeys.systems(farmId), fetchJson, { fallbackData });
}

export function useStations(farmId: string, fallbackData?: ListOf<StationDto>) {
  return useSWR<ListOf<StationDto>>(setupKeys.stations(farmId), fetchJson, { fallbackData });
}

export function useSoils(farmId: string, fallbackData?: ListOf<SoilDto>) {
  return useSWR<ListOf<SoilDto>>(setupKeys.soils(farmId), fetchJson, { fallbackData });
}
