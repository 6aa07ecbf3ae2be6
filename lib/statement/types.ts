/** The season statement as the API returns it; client-safe (types only). */
import type { AllocationUse } from "./allocation";
import type { Productivity } from "./productivity";
import type { Quantity, Term, Totals } from "./totals";

export type StatementPeriod =
  | { kind: "water-year"; year: number; label: string; from: string; to: string }
  | { kind: "season"; season: string; from: string; to: string };

export interface StatementMonth {
  /** 'YYYY-MM' */
  month: string;
  fieldDays: number;
  lines: Record<Term, Quantity>;
}

export interface StatementFieldTotals extends Totals {
  fieldId: string;
  name: string;
  /** the field's own area, ha (Totals.areaHa is 0 when it has no day in the period) */
  fieldAreaHa: number;
}

export interface StatementChoices {
  fields: { id: string; name: string; areaHa: number; archived: boolean }[];
  /** water years that hold account days, newest first, with the current one always there */
  waterYears: { year: number; label: string }[];
  /** crop seasons by name, newest first */
  seasons: { season: string; from: string; to: string | null }[];
}

export interface Statement {
  farm: { id: string; name: string; waterYearStartMonth: number };
  /** the field the statement is for, or null for the whole farm */
  field: { id: string; name: string; areaHa: number } | null;
  period: StatementPeriod;
  /** the farm's local date the statement was made on */
  madeOn: string;
  totals: Totals;
  fields: StatementFieldTotals[];
  months: StatementMonth[];
  /** the whole farm's gross irrigation against its allocation, in the water year of the period's start */
  allocation: AllocationUse & { waterYear: number; label: string; from: string; to: string };
  productivity: Productivity[];
  choices: StatementChoices;
  estimate: true;
}
