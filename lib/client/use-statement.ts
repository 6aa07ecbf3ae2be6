"use client";

import useSWR from "swr";
import type { Statement } from "@/lib/statement/types";
import { fetchJson } from "./fetcher";

/** What the statement covers; empty = the whole farm over the current water year. */
export interface StatementChoice {
  fieldId?: string;
  waterYear?: number;
  season?: string;
}

/** The query string of a choice, shared by the JSON, CSV and PDF addresses. */
export function statementQuery(choice: StatementChoice): string {
  const q = new URLSearchParams();
  if (choice.fieldId) q.set("fieldId", choice.fieldId);
  if (choice.season !== undefined) q.set("season", choice.season);
  else if (choice.waterYear !== undefined) q.set("waterYear", String(choice.waterYear));
  const s = q.toString();
  return s ? `?${s}` : "";
}

/** The season statement of a farm for a choice of field and period. */
export function useStatement(farmId: string, choice: StatementChoice) {
  return useSWR<Statement>(`/api/v1/farms/${farmId}/statement${statementQuery(choice)}`, fetchJson, { keepPreviousData: true });
}
