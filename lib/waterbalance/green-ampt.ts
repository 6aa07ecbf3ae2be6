import { requireNonNegative, requirePositive } from "./errors";
import type { GreenAmptParams } from "./soils";
import { piecesToScratchColumns, type HyetographColumns, type HyetographPiece } from "./storms";

/**
 * Green-Ampt infiltration (Green and Ampt 1911) with ponding time under unsteady rain (Mein and
 * Larson 1973), following the procedure of Chow, Maidment and Mays (1988) sections 4.3-4.5.
 * Depths in mm, time in hours, conductivity in mm/h.
 */

/**
 * Moisture deficit Δθ = η − θi across the wetting front (Chow et al. 1988 eq. 4.3.9 with
 * Se = (θi − θr)/θe), held within 0..θe.
 */
export function moistureDeficit(params: GreenAmptParams, thetaInitial: number): number {
  const d = params.porosity - thetaInitial;
  return d < 0 ? 0 : d > params.effectivePorosity ? params.effectivePorosity : d;
}

/**
 * Moisture deficit from the field's account: θi = θFC − Dr / (1000 Zr), then Δθ = η − θi.
 * @param depletionMm root-zone depletion, mm
 * @param rootDepthM root-zone depth, m
 */
export function moistureDeficitFromDepletion(
  params: GreenAmptParams,
  thetaFc: number,
  depletionMm: number,
  rootDepthM: number,
): number {
  const thetaI = thetaFc - (rootDepthM > 0 ? depletionMm / (1000 * rootDepthM) : 0);
  return moistureDeficit(params, thetaI);
}

/** Infiltration capacity f = K (1 + ψΔθ/F) (mm/h) after `cumulativeMm` has entered, Chow et al. 1988 eq. 4.3.7. */
export function infiltrationCapacityMmH(
  cumulativeMm: number,
  ksatMmH: number,
  psiDeltaThetaMm: number,
): number {
  if (cumulativeMm <= 0) return psiDeltaThetaMm > 0 ? Infinity : ksatMmH;
  return ksatMmH * (1 + psiDeltaThetaMm / cumulativeMm);
}

/**
 * Cumulative infiltration (mm) under ponding after `durationH` hours, starting from `startMm` already
 * infiltrated: the implicit Green-Ampt equation (Chow et al. 1988 eq. 4.3.6, written from a known F0
 * as in their sec. 4.5): F − F0 − ψΔθ ln[(F + ψΔθ)/(F0 + ψΔθ)] = K Δt, solved by Newton's method from above.
 */
export function pondedInfiltrationMm(
  durationH: number,
  ksatMmH: number,
  psiDeltaThetaMm: number,
  startMm = 0,
): number {
  requireNonNegative("durationH", durationH);
  return pondedStep(durationH, ksatMmH, psiDeltaThetaMm, startMm, Infinity);
}

/**
 * Newton's method on g(F) = F − F0 − a ln[(F + a)/(F0 + a)] − K Δt, started above the root: at the
 * lesser of F0 + f0 Δt (the capacity at the start only falls) and F0 + K Δt + √(2 a K Δt).
 * g is convex and increasing, so the iterates fall monotonically onto the root.
 */
function pondedStep(dt: number, k: number, a: number, f0: number, capacityAtStart: number): number {
  const kdt = k * dt;
  if (kdt === 0) return f0;
  if (a <= 1e-12) return f0 + kdt;
  const logBase = Math.log(f0 + a);
  let f = f0 + kdt + Math.sqrt(2 * a * kdt);
  const euler = f0 + capacityAtStart * dt;
  if (euler < f) f = euler;
  for (let it = 0; it < 60; it++) {
    const g = f - f0 - a * (Math.log(f + a) - logBase) - kdt;
    const step = (g * (f + a)) / f;
    f -= step;
    if (Math.abs(step) <= 1e-10 * (1 + f)) break;
  }
  return f;
}

/**
 * Ponding time (h) under a constant rain of `rainMmH` from the start, Mein and Larson (1973) as in
 * Chow et al. 1988 eq. 4.4.3: tp = K ψΔθ / [i (i − K)]; Infinity when i ≤ K (never ponds).
 */
export function pondingTimeH(rainMmH: number, ksatMmH: number, psiDeltaThetaMm: number): number {
  if (rainMmH <= ksatMmH) return Infinity;
  return (ksatMmH * psiDeltaThetaMm) / (rainMmH * (rainMmH - ksatMmH));
}

/** The result of one storm through Green-Ampt. */
export interface GreenAmptStormResult {
  rainMm: number;
  infiltrationMm: number;
  runoffMm: number;
  /** first instant the surface ponded (epoch ms), or null */
  pondedAtMs: number | null;
  /** hours the surface was ponded */
  pondedH: number;
}

/**
 * Steps a storm's unsteady hyetograph through Green-Ampt with ponding (Chow et al. 1988 sec. 4.5):
 * in each constant-intensity piece, if the capacity at its start is below the intensity the surface
 * is ponded and F follows the implicit equation; otherwise all rain enters until the capacity falls
 * to the intensity (ponding at Fp = K ψΔθ/(i − K)), after which the surface is ponded. Rain that does
 * not enter runs off; there is no surface storage. Mass is conserved piece by piece:
 * rain = infiltration + runoff.
 * @param pieces constant-intensity pieces in time order (see buildHyetograph)
 * @param params suction ψ (mm) and conductivity K (mm/h); porosity is not used here
 * @param deltaTheta moisture deficit Δθ across the wetting front
 * @param options.ksatFactor multiplies K (below 1 for a sealed surface; default 1)
 */
export function greenAmptStorm(
  pieces: readonly HyetographPiece[],
  params: Pick<GreenAmptParams, "suctionMm" | "ksatMmH">,
  deltaTheta: number,
  options: { ksatFactor?: number } = {},
): GreenAmptStormResult {
  const h = piecesToScratchColumns(pieces);
  return greenAmptColumns(h, 0, h.n, params, deltaTheta, options);
}

/** {@link greenAmptStorm} on pieces `from`..`to` (exclusive) of a columnar hyetograph. */
export function greenAmptColumns(
  h: HyetographColumns,
  from: number,
  to: number,
  params: Pick<GreenAmptParams, "suctionMm" | "ksatMmH">,
  deltaTheta: number,
  options: { ksatFactor?: number } = {},
): GreenAmptStormResult {
  const k = requirePositive("ksatMmH", params.ksatMmH) * (options.ksatFactor ?? 1);
  const a = params.suctionMm * Math.max(0, deltaTheta);
  const startMs = h.startMs;
  const endMs = h.endMs;
  const depthMm = h.depthMm;
  let f = 0;
  let rain = 0;
  let runoff = 0;
  let pondedAtMs = -1;
  let pondedH = 0;
  for (let q = from; q < to; q++) {
    const depth = depthMm[q]!;
    if (depth <= 0) continue;
    const t0 = startMs[q]!;
    const dt = (endMs[q]! - t0) / 3_600_000;
    rain += depth;
    if (dt <= 0) {
      // a zero-length catch cannot be rated for intensity; it enters the soil
      f += depth;
      continue;
    }
    const i = depth / dt;
    const cap = f > 0 ? k * (1 + a / f) : a > 0 ? Infinity : k;
    let fNew: number;
    if (cap <= i) {
      fNew = pondedStep(dt, k, a, f, cap);
      if (pondedAtMs < 0) pondedAtMs = t0;
      pondedH += dt;
    } else {
      const fTry = f + depth;
      if (k * (1 + a / fTry) > i) {
        fNew = fTry;
      } else {
        const fp = (k * a) / (i - k);
        const dtp = fp > f ? (fp - f) / i : 0;
        fNew = pondedStep(dt - dtp, k, a, fp > f ? fp : f, i);
        if (pondedAtMs < 0) pondedAtMs = t0 + dtp * 3_600_000;
        pondedH += dt - dtp;
      }
    }
    let entered = fNew - f;
    if (entered > depth) entered = depth;
    if (entered < 0) entered = 0;
    f += entered;
    runoff += depth - entered;
  }
  return {
    rainMm: rain,
    infiltrationMm: rain - runoff,
    runoffMm: runoff,
    pondedAtMs: pondedAtMs < 0 ? null : pondedAtMs,
    pondedH,
  };
}
