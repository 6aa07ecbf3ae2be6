/**
 * One day of a field's stored water account as the API answers it. Shared by the server's query module and
 * the client's hooks, so the two cannot drift apart; it holds types only and imports nothing.
 */

/** Where a day's numbers came from, as the recompute stores it (every part optional for older rows). */
export interface DayProvenanceDto {
  eto?: { method: "given" | "penman-monteith" | "hargreaves" | "filled-mean"; estimated: string[] };
  rain?: { source: string; gauges: { gaugeId: string; distanceKm: number; weight: number }[]; missing: boolean; recorded: boolean };
  runoff?:
    | { method: "none" }
    | { method: "curve-number"; condition: string; curveNumber: number; iaRatio: number; source: string }
    | { method: "green-ampt"; storms: unknown[]; sealed: boolean; sealFormed: boolean; droppedTips: number };
  irrigation?: "none" | "gross" | "net" | "mixed";
  stage?: string;
  qc?: string;
  carriedDepletionMm?: number;
}

export interface AccountDayDto {
  date: string;
  etoMm: number | null;
  kc: number | null;
  etcMm: number | null;
  ks: number | null;
  etActualMm: number | null;
  rainMm: number | null;
  runoffMm: number | null;
  effectiveRainMm: number | null;
  irrigationGrossMm: number | null;
  irrigationNetMm: number | null;
  capillaryRiseMm: number | null;
  deepPercolationMm: number | null;
  depletionStartMm: number;
  depletionEndMm: number;
  tawMm: number | null;
  rawMm: number | null;
  pAdjusted: number | null;
  rootDepthM: number | null;
  soilCheckReset: boolean;
  provenance: DayProvenanceDto;
}
