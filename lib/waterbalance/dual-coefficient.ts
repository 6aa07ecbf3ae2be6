import { requireRange } from "./errors";
import { climateTerm } from "./crop-coefficient";

/** FAO-56 chapter 7: the dual crop coefficient, Kc = Ks Kcb + Ke, and the surface-layer water balance. */

/** Fraction of the surface wetted, fw, by kind of wetting (FAO-56 Table 20, mid-range values). */
export const WETTED_FRACTION_BY_WETTING = {
  precipitation: 1.0,
  sprinkler: 1.0,
  basin: 1.0,
  border: 1.0,
  furrowNarrowBed: 0.8,
  furrowWideBed: 0.5,
  furrowAlternate: 0.4,
  trickle: 0.35,
} as const;

/**
 * Upper limit on Kc after wetting, FAO-56 eq. 72:
 * Kc max = max({1.2 + [0.04 (u2 − 2) − 0.004 (RHmin − 45)] (h/3)^0.3}, {Kcb + 0.05}).
 */
export function kcMax(windMs: number, rhMinPct: number, heightM: number, kcb: number): number {
  return Math.max(1.2 + climateTerm(windMs, rhMinPct, heightM), kcb + 0.05);
}

/**
 * Total evaporable water TEW (mm) of the surface layer, FAO-56 eq. 73: TEW = 1000 (θFC − 0.5 θWP) Ze.
 * @param zeM depth of the surface layer, m (0.10-0.15)
 */
export function totalEvaporableWaterMm(thetaFc: number, thetaWp: number, zeM: number): number {
  requireRange("zeM", zeM, 0.01, 0.5);
  return 1000 * (thetaFc - 0.5 * thetaWp) * zeM;
}

/**
 * Evaporation reduction coefficient Kr, FAO-56 eq. 74: 1 while De ≤ REW (stage 1), else
 * (TEW − De)/(TEW − REW).
 * @param deMm depletion of the surface layer at the end of the previous day, mm
 */
export function evaporationReductionKr(deMm: number, tewMm: number, rewMm: number): number {
  if (deMm <= rewMm) return 1;
  if (tewMm <= rewMm) return 0;
  const kr = (tewMm - deMm) / (tewMm - rewMm);
  return kr < 0 ? 0 : kr > 1 ? 1 : kr;
}

/**
 * Effective ground cover fc, FAO-56 eq. 76: ((Kcb − Kc min)/(Kc max − Kc min))^(1 + 0.5 h), limited to 0-0.99.
 * @param kcMin Kc of dry bare soil (≈ 0.15 annual crops)
 */
export function canopyCoverFraction(
  kcb: number,
  kcMinValue: number,
  kcMaxValue: number,
  heightM: number,
): number {
  if (kcMaxValue <= kcMinValue) return 0;
  const x = (kcb - kcMinValue) / (kcMaxValue - kcMinValue);
  if (x <= 0) return 0;
  return Math.min(0.99, Math.pow(x, 1 + 0.5 * heightM));
}

/** Exposed and wetted soil fraction few, FAO-56 eq. 75: min(1 − fc, fw). */
export function exposedWettedFraction(fc: number, fw: number): number {
  return Math.max(0.01, Math.min(1 - fc, fw));
}

/**
 * Soil evaporation coefficient Ke, FAO-56 eq. 71: Ke = Kr (Kc max − Kcb) ≤ few Kc max.
 */
export function evaporationCoefficient(kr: number, kcMaxValue: number, kcb: number, few: number): number {
  return Math.max(0, Math.min(kr * (kcMaxValue - kcb), few * kcMaxValue));
}

/** The surface layer after one day. */
export interface SurfaceLayerDay {
  /** soil evaporation coefficient */
  ke: number;
  /** evaporation from the exposed soil, mm (over the whole field) */
  evaporationMm: number;
  /** surface-layer depletion at the end of the day, mm */
  deEndMm: number;
  /** drainage out of the surface layer, mm (eq. 79) */
  deepPercolationMm: number;
}

/**
 * One day of the surface-layer balance, FAO-56 eq. 71, 74, 77-79:
 * De,i = De,i−1 − (P − RO) − I/fw + E/few + DPe, with 0 ≤ De ≤ TEW.
 * Transpiration from the surface layer (Tew) is neglected, as FAO-56 allows for most crops.
 * @param deStartMm depletion at the end of the previous day, mm
 * @param effectiveRainMm P − RO, mm
 * @param irrigationNetMm net irrigation over the field, mm
 */
export function surfaceLayerStep(
  deStartMm: number,
  effectiveRainMm: number,
  irrigationNetMm: number,
  etoMm: number,
  kcb: number,
  kcMaxValue: number,
  few: number,
  fw: number,
  tewMm: number,
  rewMm: number,
): SurfaceLayerDay {
  // Rain and irrigation are taken to arrive early in the day, so Kr sees the rewetted layer
  // (common practice, no source; FAO-56 eq. 74 writes Kr from De,i-1).
  const wetIn = effectiveRainMm + (fw > 0 ? irrigationNetMm / fw : 0);
  let de = deStartMm - wetIn;
  let dp = 0;
  if (de < 0) {
    dp = -de;
    de = 0;
  }
  const kr = evaporationReductionKr(de, tewMm, rewMm);
  let ke = evaporationCoefficient(kr, kcMaxValue, kcb, few);
  let e = ke * etoMm;
  const room = tewMm - de;
  if (e / few > room) {
    e = Math.max(0, room * few);
    ke = etoMm > 0 ? e / etoMm : 0;
  }
  de += e / few;
  return { ke, evaporationMm: e, deEndMm: Math.min(tewMm, de), deepPercolationMm: dp };
}
