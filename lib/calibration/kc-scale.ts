import { minimiseOnInterval } from "./search";
import { errorStats, sumOfSquares, type CheckPair, type ErrorStats } from "./stats";

/**
 * A Kc scale factor from a planting's soil checks, by least squares over the checks.
 *
 * Method: the account is re-run with every Kc of the curve (ini, mid, end, before the FAO-56 eq. 62
 * climate adjustment) multiplied by k, and k is chosen to minimise
 *
 *     S(k) = Σ_i (D_model,i(k) − D_check,i)²
 *
 * where D_model,i(k) is the depletion the account carries into the day of check i, before that check
 * resets it. Each check still resets the account in the re-runs, so every term measures how well the
 * model carried the water from the previous check (or from sowing) to this one; the checks are not
 * double-counted. S is minimised by a direct 1-D search ({@link minimiseOnInterval}: a scan of
 * [0.5, 2] then golden section), not a linearised estimate, because depletion is not linear in k once
 * Ks < 1 or the root zone fills to field capacity.
 *
 * Only the scale is fitted; stage lengths, root depth and p stay as set. With fewer than
 * {@link MIN_CHECKS_FOR_SUGGESTION} checks no factor is suggested.
 */

export const KC_SCALE_MIN = 0.5;
export const KC_SCALE_MAX = 2;
/** A factor from one or two checks mostly fits their noise (common practice, no source). */
export const MIN_CHECKS_FOR_SUGGESTION = 3;

export interface KcScaleSuggestion {
  /** the factor, rounded to 0.01, or null when there are too few checks */
  scale: number | null;
  /** the statistics the account would have with that factor */
  withScale: ErrorStats | null;
  evaluations: number;
  method: "least-squares 1-D search (scan then golden section) re-running the account";
}

/**
 * Suggests the Kc scale.
 * @param observedMm the checks' depletions, mm, in the order `modelledAt` answers
 * @param modelledAt runs the account with Kc × k and returns the modelled depletion at each check, mm
 * @param options the interval searched (default 0.5-2)
 */
export function suggestKcScale(
  observedMm: readonly number[],
  modelledAt: (scale: number) => readonly number[],
  options: { lo?: number; hi?: number } = {},
): KcScaleSuggestion {
  const method = "least-squares 1-D search (scan then golden section) re-running the account" as const;
  if (observedMm.length < MIN_CHECKS_FOR_SUGGESTION)
    return { scale: null, withScale: null, evaluations: 0, method };
  const found = minimiseOnInterval(
    (k) => sumOfSquares(modelledAt(k), observedMm),
    options.lo ?? KC_SCALE_MIN,
    options.hi ?? KC_SCALE_MAX,
    {
      tolerance: 1e-3,
    },
  );
  const scale = Math.round(found.x * 100) / 100;
  const modelled = modelledAt(scale);
  const withScale = errorStats(observedMm.map((o, k) => ({ observedMm: o, modelledMm: modelled[k] ?? NaN })));
  return { scale, withScale, evaluations: found.evaluations + 1, method };
}

/**
 * Pairs each check with the account day of its date: the modelled value is the depletion carried into
 * the day (before a check's reset). Checks without an account day are left out.
 */
export function pairChecks(
  checks: readonly { date: string; depletionMm: number }[],
  days: ReadonlyMap<string, number>,
): CheckPair[] {
  const out: CheckPair[] = [];
  for (const c of checks) {
    const m = days.get(c.date);
    if (m !== undefined) out.push({ date: c.date, observedMm: c.depletionMm, modelledMm: m });
  }
  return out;
}
