import { requireNonNegative, requireRange, WaterBalanceInputError } from "./errors";

/** FAO-56 chapter 6 single crop coefficient, root depth and p; chapter 8 Ks. */

/** Lengths of the four growth stages, days (FAO-56 Table 11). */
export interface StageLengths {
  iniDays: number;
  devDays: number;
  midDays: number;
  lateDays: number;
}

/** Coefficients at the three anchor points of a crop curve (FAO-56 Table 12 or 17). */
export interface CoefficientCurve {
  ini: number;
  mid: number;
  end: number;
}

/** Growth stage of a day in the season; 'before' and 'after' are fallow. */
export type CropStage = "before" | "initial" | "development" | "mid" | "late" | "after";

/** Throws unless every stage length is a whole number of days ≥ 0 and the season has at least one day. */
export function validateStages(stages: StageLengths): void {
  for (const k of ["iniDays", "devDays", "midDays", "lateDays"] as const) {
    requireNonNegative(`stages.${k}`, stages[k]);
    if (!Number.isInteger(stages[k]))
      throw new WaterBalanceInputError(`stages.${k}`, "must be a whole number of days");
  }
  if (seasonLengthDays(stages) < 1)
    throw new WaterBalanceInputError("stages", "the season must last at least one day");
}

/** Total season length, days. */
export function seasonLengthDays(s: StageLengths): number {
  return s.iniDays + s.devDays + s.midDays + s.lateDays;
}

/** Stage of day `dayOfSeason` (1 on the planting date). */
export function cropStageForDay(dayOfSeason: number, s: StageLengths): CropStage {
  if (dayOfSeason < 1) return "before";
  if (dayOfSeason <= s.iniDays) return "initial";
  if (dayOfSeason <= s.iniDays + s.devDays) return "development";
  if (dayOfSeason <= s.iniDays + s.devDays + s.midDays) return "mid";
  if (dayOfSeason <= seasonLengthDays(s)) return "late";
  return "after";
}

/**
 * Crop coefficient on day `dayOfSeason` (1 on the planting date) of a curve with anchor values
 * `curve` and stage lengths `stages`, FAO-56 eq. 66: flat at Kc ini through the initial stage,
 * linear to Kc mid over development, flat through mid-season, linear to Kc end over late season:
 * Kc,i = Kc,prev + [(i − ΣL,prev)/L,stage] (Kc,next − Kc,prev). Works for Kcb (chapter 7) too.
 * Outside the season it returns `fallow` (default: Kc ini).
 */
export function kcForDay(
  dayOfSeason: number,
  curve: CoefficientCurve,
  stages: StageLengths,
  fallow = curve.ini,
): number {
  const a = stages.iniDays;
  const b = a + stages.devDays;
  const c = b + stages.midDays;
  const d = c + stages.lateDays;
  if (dayOfSeason < 1 || dayOfSeason > d) return fallow;
  if (dayOfSeason <= a) return curve.ini;
  if (dayOfSeason <= b) return curve.ini + ((dayOfSeason - a) / stages.devDays) * (curve.mid - curve.ini);
  if (dayOfSeason <= c) return curve.mid;
  return curve.mid + ((dayOfSeason - c) / stages.lateDays) * (curve.end - curve.mid);
}

/** Climate term of FAO-56 eq. 62/65/72: [0.04 (u2 − 2) − 0.004 (RHmin − 45)] (h/3)^0.3, inputs held within FAO-56's stated ranges. */
export function climateTerm(windMs: number, rhMinPct: number, heightM: number): number {
  const u2 = Math.min(6, Math.max(1, windMs));
  const rh = Math.min(80, Math.max(20, rhMinPct));
  const h = Math.min(10, Math.max(0.1, heightM));
  return (0.04 * (u2 - 2) - 0.004 * (rh - 45)) * Math.pow(h / 3, 0.3);
}

/**
 * Kc mid adjusted for climate, FAO-56 eq. 62:
 * Kc mid = Kc mid(Tab) + [0.04 (u2 − 2) − 0.004 (RHmin − 45)] (h/3)^0.3,
 * with u2 (m/s at 2 m) 1-6, RHmin (%) 20-80 and crop height h (m) 0.1-10 as FAO-56 limits them.
 * @param kcMidTable Kc mid from FAO-56 Table 12 (sub-humid, u2 = 2 m/s, RHmin = 45 %)
 * @param windMs mean daily u2 over the mid-season stage, m/s
 * @param rhMinPct mean daily RHmin over the mid-season stage, %
 * @param heightM mean crop height during mid-season, m
 */
export function adjustKcMidForClimate(
  kcMidTable: number,
  windMs: number,
  rhMinPct: number,
  heightM: number,
): number {
  return kcMidTable + climateTerm(windMs, rhMinPct, heightM);
}

/**
 * Kc end adjusted for climate, FAO-56 eq. 65: same correction as eq. 62 with late-season means,
 * applied only when Kc end(Tab) ≥ 0.45 (FAO-56: no adjustment below that).
 */
export function adjustKcEndForClimate(
  kcEndTable: number,
  windMs: number,
  rhMinPct: number,
  heightM: number,
): number {
  if (kcEndTable < 0.45) return kcEndTable;
  return kcEndTable + climateTerm(windMs, rhMinPct, heightM);
}

/**
 * Effective root depth (m) on day `dayOfSeason`: Zr min at planting, growing linearly to Zr max at
 * the start of mid-season and held there (FAO-56 ch. 8; linear growth is common practice, no source).
 * Before planting the root zone is Zr min.
 */
export function rootDepthForDayM(
  dayOfSeason: number,
  rootDepthMinM: number,
  rootDepthMaxM: number,
  stages: StageLengths,
): number {
  const full = stages.iniDays + stages.devDays;
  if (dayOfSeason <= 1) return rootDepthMinM;
  if (full <= 1 || dayOfSeason >= full) return rootDepthMaxM;
  return rootDepthMinM + ((dayOfSeason - 1) / (full - 1)) * (rootDepthMaxM - rootDepthMinM);
}

/**
 * Depletion fraction p adjusted for the day's crop ET, FAO-56 Table 22 footnote:
 * p = p(Tab) + 0.04 (5 − ETc), limited to 0.1 ≤ p ≤ 0.8.
 * @param pTable p from FAO-56 Table 22 (for ETc ≈ 5 mm/d)
 * @param etcMm the day's crop ET without stress, mm/d
 */
export function adjustPForEtc(pTable: number, etcMm: number): number {
  const p = pTable + 0.04 * (5 - etcMm);
  return p < 0.1 ? 0.1 : p > 0.8 ? 0.8 : p;
}

/**
 * Water stress coefficient Ks, FAO-56 eq. 84: 1 while Dr ≤ RAW, else (TAW − Dr)/((1 − p) TAW) = (TAW − Dr)/(TAW − RAW).
 * @param depletionMm root-zone depletion at the start of the day, mm
 * @param tawMm total available water, mm
 * @param rawMm readily available water, mm
 */
export function waterStressCoefficient(depletionMm: number, tawMm: number, rawMm: number): number {
  if (depletionMm <= rawMm) return 1;
  const span = tawMm - rawMm;
  if (span <= 0) return depletionMm < tawMm ? 1 : 0;
  const ks = (tawMm - depletionMm) / span;
  return ks < 0 ? 0 : ks > 1 ? 1 : ks;
}

/** Throws unless `0 ≤ kc ≤ 2` (FAO-56 values stay well inside). */
export function validateCurve(name: string, c: CoefficientCurve): void {
  requireRange(`${name}.ini`, c.ini, 0, 2);
  requireRange(`${name}.mid`, c.mid, 0, 2);
  requireRange(`${name}.end`, c.end, 0, 2);
}
