import { requireNonNegative, requireRange, WaterBalanceInputError } from "./errors";

/**
 * Runoff from daily rain totals: the NRCS curve number method, NEH Part 630 chapter 10
 * (Q = (P − Ia)² / (P − Ia + S) for P > Ia), with the antecedent condition taken from the account.
 */

/** Antecedent runoff condition: NEH's dry (I), average (II) and wet (III) curve number forms. */
export type AntecedentCondition = "dry" | "average" | "wet";

/** Potential maximum retention S (mm) of curve number `cn`: S = 25400/CN − 254 (NEH Part 630 ch. 10, S = 1000/CN − 10 in inches). */
export function potentialRetentionMm(cn: number): number {
  requireRange("curveNumber", cn, 1, 100);
  return 25400 / cn - 254;
}

/** Options for {@link curveNumberRunoffMm}. */
export interface CurveNumberOptions {
  /** initial abstraction ratio λ in Ia = λ S: 0.2 (NEH 630 ch. 10, default) or 0.05 */
  iaRatio?: 0.2 | 0.05;
  /**
   * With λ = 0.05, convert S from the handbook's λ = 0.2 curve numbers: S0.05 = 1.33 S0.2^1.15 (S in
   * inches; Hawkins, Jiang, Woodward, Hjelmfelt and Van Mullem 2002, from memory). Default true.
   */
  convertRetention?: boolean;
}

/**
 * Direct runoff Q (mm) from a day's rain `rainMm` on a surface of curve number `cn`, NEH Part 630
 * ch. 10: Q = (P − Ia)² / (P − Ia + S) for P > Ia, else 0; Ia = λ S.
 */
export function curveNumberRunoffMm(rainMm: number, cn: number, options: CurveNumberOptions = {}): number {
  requireNonNegative("rainMm", rainMm);
  const lambda = options.iaRatio ?? 0.2;
  let s = potentialRetentionMm(cn);
  if (lambda === 0.05 && options.convertRetention !== false) {
    s = 25.4 * 1.33 * Math.pow(s / 25.4, 1.15);
  }
  return runoffFromRetentionMm(rainMm, s, lambda);
}

/** Q (mm) for rain `rainMm`, retention `sMm` and ratio `lambda` (the NEH equation without the CN step). */
export function runoffFromRetentionMm(rainMm: number, sMm: number, lambda: number): number {
  const ia = lambda * sMm;
  if (rainMm <= ia) return 0;
  const x = rainMm - ia;
  return (x * x) / (x + sMm);
}

/** Formula used to move a curve number between antecedent conditions. */
export type AntecedentFormula = "hawkins-1985" | "chow-1988";

/**
 * Curve number for antecedent condition `condition` from the average-condition (II) number `cnAverage`.
 * 'hawkins-1985' (default): CN I = CN/(2.281 − 0.01281 CN), CN III = CN/(0.427 + 0.00573 CN), the fit to
 * NEH 630 ch. 10 Table 10-1 by Hawkins, Hjelmfelt and Zevenbergen (1985) (from memory).
 * 'chow-1988': CN I = 4.2 CN/(10 − 0.058 CN), CN III = 23 CN/(10 + 0.13 CN), Chow, Maidment and Mays
 * (1988) eq. 5.5.4-5.5.5 after NEH-4 (1972) (from memory).
 */
export function curveNumberForCondition(
  cnAverage: number,
  condition: AntecedentCondition,
  formula: AntecedentFormula = "hawkins-1985",
): number {
  requireRange("curveNumber", cnAverage, 1, 100);
  if (condition === "average") return cnAverage;
  let cn: number;
  if (formula === "hawkins-1985") {
    cn =
      condition === "dry"
        ? cnAverage / (2.281 - 0.01281 * cnAverage)
        : cnAverage / (0.427 + 0.00573 * cnAverage);
  } else {
    cn =
      condition === "dry"
        ? (4.2 * cnAverage) / (10 - 0.058 * cnAverage)
        : (23 * cnAverage) / (10 + 0.13 * cnAverage);
  }
  return Math.min(100, Math.max(1, cn));
}

/** Source text for a formula, for the account's provenance. */
export function antecedentFormulaSource(formula: AntecedentFormula): string {
  return formula === "hawkins-1985"
    ? "NEH 630 ch. 10 Table 10-1 (Hawkins, Hjelmfelt and Zevenbergen 1985 fit)"
    : "Chow, Maidment and Mays 1988 eq. 5.5.4-5.5.5 (NEH-4)";
}

/** Thresholds on Dr/TAW that decide the antecedent condition from the account. */
export interface AntecedentThresholds {
  /** wet (III) when Dr/TAW is at or below this (default 0.1: near field capacity, common practice, no source) */
  wetAtOrBelow?: number;
  /** dry (I) when Dr/TAW is at or above this (default 0.5, common practice, no source) */
  dryAtOrAbove?: number;
}

/** Antecedent condition of a field whose root zone is `depletionMm` short of field capacity out of `tawMm`. */
export function antecedentFromDepletion(
  depletionMm: number,
  tawMm: number,
  t: AntecedentThresholds = {},
): AntecedentCondition {
  const frac = tawMm > 0 ? depletionMm / tawMm : 0;
  if (frac <= (t.wetAtOrBelow ?? 0.1)) return "wet";
  if (frac >= (t.dryAtOrAbove ?? 0.5)) return "dry";
  return "average";
}

/** Hydrologic soil group (NEH Part 630 ch. 7). */
export type HydrologicSoilGroup = "A" | "B" | "C" | "D";

/** Cover and treatment of a cultivated field, for the curve number table. */
export type RunoffCover =
  | "fallow-bare"
  | "row-crop-straight-poor"
  | "row-crop-straight-good"
  | "row-crop-contoured-good"
  | "small-grain-straight-good"
  | "legume-rotation-straight-good"
  | "pasture-good"
  | "pasture-fair"
  | "pasture-poor";

/**
 * Average-condition curve numbers for agricultural lands, NEH Part 630 ch. 9 Table 9-1 / TR-55
 * Table 2-2b (from memory), by hydrologic soil group A, B, C, D.
 */
export const CURVE_NUMBER_TABLE: Readonly<Record<RunoffCover, readonly [number, number, number, number]>> =
  Object.freeze({
    "fallow-bare": [77, 86, 91, 94],
    "row-crop-straight-poor": [72, 81, 88, 91],
    "row-crop-straight-good": [67, 78, 85, 89],
    "row-crop-contoured-good": [65, 75, 82, 86],
    "small-grain-straight-good": [63, 75, 83, 87],
    "legume-rotation-straight-good": [58, 72, 81, 85],
    "pasture-good": [39, 61, 74, 80],
    "pasture-fair": [49, 69, 79, 84],
    "pasture-poor": [68, 79, 86, 89],
  });

/** Curve number (condition II) for a hydrologic soil group and cover, from {@link CURVE_NUMBER_TABLE}. */
export function curveNumberFor(group: HydrologicSoilGroup, cover: RunoffCover): number {
  const row = CURVE_NUMBER_TABLE[cover];
  if (!row) throw new WaterBalanceInputError("runoff.cover", `unknown cover "${cover}"`);
  const i = "ABCD".indexOf(group);
  const cn = row[i];
  if (cn === undefined)
    throw new WaterBalanceInputError("runoff.hydrologicSoilGroup", `unknown group "${group}"`);
  return cn;
}

/**
 * Curve number adjusted for slope, Williams (1995) as used in SWAT (Neitsch et al. 2011 eq. 2:1.1.4;
 * from memory): CN2s = (CN3 − CN2)/3 · (1 − 2 e^(−13.86 slope)) + CN2, slope in m/m; the tables assume 5 %.
 */
export function slopeAdjustedCurveNumber(cnAverage: number, slopePct: number): number {
  requireRange("slopePct", slopePct, 0, 100);
  const cn3 = curveNumberForCondition(cnAverage, "wet");
  const adj = ((cn3 - cnAverage) / 3) * (1 - 2 * Math.exp(-13.86 * (slopePct / 100))) + cnAverage;
  return Math.min(100, Math.max(1, adj));
}
