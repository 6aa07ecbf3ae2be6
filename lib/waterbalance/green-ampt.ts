import { requireNonNegative, requirePositive } from "./errors";
import type { GreenAmptParams } from "./soils";
import type { HyetographPiece } from "./storms";

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
export function moistureDeficitFromDepletion(params: GreenAmptParams, thetaFc: number, depletionMm: number, rootDepthM: number): number {
  const thetaI = thetaFc - (rootDepthM > 0 ? depletionMm / (1000 * rootDepthM) : 0);
  return moistureDeficit(params, thetaI);
}

/** Infiltration capacity f = K (1 + ψΔθ/F) (mm/h) after `cumulativeMm` has entered, Chow et al. 1988 eq. 4.3.7. */
export function infiltrationCapacityMmH(cumulativeMm: number, ksatMmH: number, psiDeltaThetaMm: number): number {
  if (cumulativeMm <= 0) return psiDeltaThetaMm > 0 ? Infinity : ksatMmH;
  return ksatMmH * (1 + psiDeltaThetaMm / cumulativeMm);
}

/**
 * Cumulative infiltration (mm) under ponding after `durationH` hours, starting from `startMm` already
 * infiltrated: the implicit Green-Ampt equation (Chow et al. 1988 eq. 4.3.6, written from a known F0
 * as in their sec. 4.5): F − F0 − ψΔθ ln[(F + ψΔθ)/(F0 + ψΔθ)] = K Δt, solved by Newton's method from above.
 */
export function pondedInfiltrationMm(durationH: number, ksatMmH: number, psiDeltaThetaMm: number, startMm = 0): number {
  requireNonNegative("durationH", durationH);
  const kdt = ksatMmH * durationH;
  if (kdt === 0) return startMm;
  const a = psiDeltaThetaMm;
  if (a <= 1e-12) return startMm + kdt;
  const logBase = Math.log(startMm + a);
  let f = startMm + kdt + Math.sqrt(2 * a * kdt);
  for (let it = 0; it < 60; it++) {
    const g = f - startMm - a * (Math.log(f + a) - logBase) - kdt;
    const dg = f / (f + a);
    const step = g / dg;
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
  const k = requirePositive("ksatMmH", params.ksatMmH) * (options.ksatFactor ?? 1);
  const a = params.suctionMm * Math.max(0, deltaTheta);
  let f = 0;
  let rain = 0;
  let runoff = 0;
  let pondedAtMs: number | null = null;
  let pondedH = 0;
  for (const p of pieces) {
    const dt = (p.endMs - p.startMs) / 3_600_000;
    if (p.depthMm <= 0) continue;
    rain += p.depthMm;
    if (dt <= 0) {
      // a zero-length catch cannot be rated for intensity; it enters the soil
      f += p.depthMm;
      continue;
    }
    const i = p.depthMm / dt;
    const cap = infiltrationCapacityMmH(f, k, a);
    let fNew: number;
    if (cap <= i) {
      fNew = pondedInfiltrationMm(dt, k, a, f);
      if (pondedAtMs === null) pondedAtMs = p.startMs;
      pondedH += dt;
    } else {
      const fTry = f + p.depthMm;
      if (infiltrationCapacityMmH(fTry, k, a) > i) {
        fNew = fTry;
      } else {
        const fp = (k * a) / (i - k);
        const dtp = Math.max(0, (fp - f) / i);
        fNew = pondedInfiltrationMm(dt - dtp, k, a, Math.max(f, fp));
        if (pondedAtMs === null) pondedAtMs = p.startMs + dtp * 3_600_000;
        pondedH += dt - dtp;
      }
    }
    let entered = fNew - f;
    if (entered > p.depthMm) entered = p.depthMm;
    if (entered < 0) entered = 0;
    f += entered;
    runoff += p.depthMm - entered;
  }
  return { rainMm: rain, infiltrationMm: rain - runoff, runoffMm: runoff, pondedAtMs, pondedH };
}
