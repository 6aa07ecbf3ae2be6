/**
 * One-dimensional minimisation on an interval: a coarse scan, then golden-section search around the
 * best scanned point. The scan guards against an objective that is not unimodal over the whole
 * interval (a crop that hits wilting point at high Kc flattens it); golden section then narrows the
 * bracket by 0.618 per evaluation (Kiefer 1953; Press et al., Numerical Recipes, ch. 10.2).
 */

export interface MinimumFound {
  /** the argument of the smallest value found */
  x: number;
  /** f(x) */
  value: number;
  /** how many times f was called */
  evaluations: number;
}

export interface MinimiseOptions {
  /** points of the coarse scan, ends included (default 13) */
  scanPoints?: number;
  /** stop when the bracket is narrower than this (default 1e-4) */
  tolerance?: number;
  /** at most this many golden-section steps (default 60) */
  maxSteps?: number;
}

const INV_PHI = (Math.sqrt(5) - 1) / 2;

/**
 * The x in [lo, hi] where f is smallest (to `tolerance`, within the scanned point's neighbours).
 * @param f the objective; NaN counts as +∞
 * @param lo lower end of the interval
 * @param hi upper end of the interval (> lo)
 */
export function minimiseOnInterval(
  f: (x: number) => number,
  lo: number,
  hi: number,
  options: MinimiseOptions = {},
): MinimumFound {
  if (!(hi > lo)) throw new RangeError("minimiseOnInterval: hi must be greater than lo");
  const scan = Math.max(3, options.scanPoints ?? 13);
  const tol = options.tolerance ?? 1e-4;
  const maxSteps = options.maxSteps ?? 60;
  let evaluations = 0;
  const g = (x: number): number => {
    evaluations++;
    const v = f(x);
    return Number.isNaN(v) ? Infinity : v;
  };
  const step = (hi - lo) / (scan - 1);
  let best = 0;
  let bestValue = Infinity;
  for (let k = 0; k < scan; k++) {
    const v = g(lo + k * step);
    if (v < bestValue) {
      bestValue = v;
      best = k;
    }
  }
  let a = lo + Math.max(0, best - 1) * step;
  let b = lo + Math.min(scan - 1, best + 1) * step;
  let bestX = lo + best * step;
  let c = b - INV_PHI * (b - a);
  let d = a + INV_PHI * (b - a);
  let fc = g(c);
  let fd = g(d);
  for (let s = 0; s < maxSteps && b - a > tol; s++) {
    if (fc <= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - INV_PHI * (b - a);
      fc = g(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + INV_PHI * (b - a);
      fd = g(d);
    }
  }
  for (const [x, v] of [
    [c, fc],
    [d, fd],
  ] as const) {
    if (v < bestValue) {
      bestValue = v;
      bestX = x;
    }
  }
  return { x: bestX, value: bestValue, evaluations };
}
