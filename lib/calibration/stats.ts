/**
 * How far the modelled depletion is from the soil checks: error = modelled − observed, mm, so a
 * positive mean error (bias) says the account runs drier than the field.
 */

/** A soil check beside the account's depletion on the same day. */
export interface CheckPair {
  date: string;
  /** depletion measured by the check, mm */
  observedMm: number;
  /** depletion the account carried into that day, before the check reset it, mm */
  modelledMm: number;
}

/** Error statistics over the pairs; null where there is no pair. */
export interface ErrorStats {
  n: number;
  /** mean error (bias), mm: Σ(m − o) / n */
  meanErrorMm: number | null;
  /** root-mean-square error, mm: √(Σ(m − o)² / n) */
  rmseMm: number | null;
  /** mean absolute error, mm: Σ|m − o| / n */
  maeMm: number | null;
}

/**
 * Mean error, RMSE and MAE of modelled against observed depletion.
 * @param pairs each with `observedMm` and `modelledMm`, mm
 * @returns n and the three statistics in mm (null when n = 0)
 */
export function errorStats(pairs: readonly Pick<CheckPair, "observedMm" | "modelledMm">[]): ErrorStats {
  const n = pairs.length;
  if (n === 0) return { n, meanErrorMm: null, rmseMm: null, maeMm: null };
  let sum = 0;
  let sumSq = 0;
  let sumAbs = 0;
  for (const p of pairs) {
    const e = p.modelledMm - p.observedMm;
    sum += e;
    sumSq += e * e;
    sumAbs += Math.abs(e);
  }
  return { n, meanErrorMm: sum / n, rmseMm: Math.sqrt(sumSq / n), maeMm: sumAbs / n };
}

/** Σ(modelled − observed)², mm². */
export function sumOfSquares(modelledMm: readonly number[], observedMm: readonly number[]): number {
  let s = 0;
  for (let k = 0; k < observedMm.length; k++) {
    const e = (modelledMm[k] ?? NaN) - observedMm[k]!;
    s += e * e;
  }
  return s;
}
