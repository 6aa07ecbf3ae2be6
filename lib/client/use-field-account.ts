"use client";

import useSWR from "swr";
import type { AccountDayDto } from "@/lib/accounts/day-types";
import { fetchJson } from "./fetcher";

export type { AccountDayDto, DayProvenanceDto } from "@/lib/accounts/day-types";

export interface FieldAccountDto {
  fieldId: string;
  name: string;
  from: string;
  to: string;
  dirtyFrom: string | null;
  data: AccountDayDto[];
}

/** The field's stored water account between two farm-local dates. */
export function useFieldAccount(farmId: string, fieldId: string, from: string, to: string) {
  return useSWR<FieldAccountDto>(`/api/v1/farms/${farmId}/fields/${fieldId}/account?from=${from}&to=${to}`, fetchJson);
}
