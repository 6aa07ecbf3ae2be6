"use client";

import type { MultiPolygon, Polygon } from "geojson";
import useSWR from "swr";
import { fetchJson } from "./fetcher";

export interface FieldDto {
  id: string;
  name: string;
  boundary: Polygon | MultiPolygon | null;
  areaHa: number;
  centroidLat: number | null;
  centroidLon: number | null;
  soilId: string | null;
  slopePct: number | null;
  irrigationSystemId: string | null;
  gaugeId: string | null;
  curveNumber: number | null;
  accountDirtyFrom: string | null;
}

/** The API's largest page; a farm with more fields than this pages through in one SWR call. */
const PAGE = 1000;

async function allFields(url: string): Promise<FieldDto[]> {
  const out: FieldDto[] = [];
  for (let offset = 0; ; ) {
    const page = await fetchJson<{ data: FieldDto[]; page: { nextOffset: number | null } }>(`${url}?limit=${PAGE}&offset=${offset}`);
    out.push(...page.data);
    if (page.page.nextOffset === null) return out;
    offset = page.page.nextOffset;
  }
}

/** Every live field of the farm with its boundary. */
export function useFields(farmId: string) {
  return useSWR<FieldDto[]>(`/api/v1/farms/${farmId}/fields`, allFields);
}

/** One field (GET /fields/:fieldId). */
export function useField(farmId: string, fieldId: string) {
  return useSWR<{ field: FieldDto }>(`/api/v1/farms/${farmId}/fields/${fieldId}`, fetchJson);
}
