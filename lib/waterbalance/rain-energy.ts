import { requireNonNegative } from "./errors";
import type { HyetographPiece } from "./storms";

/** Rain kinetic energy and erosivity from the intensity record: unit energy, storm energy, I30, EI30. */

/** Unit kinetic energy relation. */
export type KineticEnergyMethod = "mcgregor-1995" | "brown-foster-1987" | "wischmeier-smith-1978";

/**
 * Unit kinetic energy e (MJ ha⁻¹ mm⁻¹) of rain at intensity `intensityMmH`:
 * 'mcgregor-1995' (RUSLE2, default): e = 0.29 [1 − 0.72 exp(−0.082 i)] (McGregor et al. 1995);
 * 'brown-foster-1987' (RUSLE1): e = 0.29 [1 − 0.72 exp(−0.05 i)] (Brown and Foster 1987);
 * 'wischmeier-smith-1978' (USLE): e = 0.119 + 0.0873 log10 i, held at 0.283 above 76 mm/h
 * (Wischmeier and Smith 1978, metric form).
 */
export function unitKineticEnergyMJhaMm(intensityMmH: number, method: KineticEnergyMethod = "mcgregor-1995"): number {
  requireNonNegative("intensityMmH", intensityMmH);
  switch (method) {
    case "mcgregor-1995":
      return 0.29 * (1 - 0.72 * Math.exp(-0.082 * intensityMmH));
    case "brown-foster-1987":
      return 0.29 * (1 - 0.72 * Math.exp(-0.05 * intensityMmH));
    case "wischmeier-smith-1978":
      if (intensityMmH <= 0) return 0;
      if (intensityMmH > 76) return 0.283;
      // the log form goes negative below about 0.04 mm/h; such drizzle carries no energy
      return Math.max(0, 0.119 + 0.0873 * Math.log10(intensityMmH));
  }
}

/**
 * Greatest depth (mm) that fell in any window of `windowMin` minutes, with rain spread evenly inside
 * each piece. The best window starts or ends at a piece boundary, so only those are tried (O(n)).
 */
export function maxDepthInWindowMm(pieces: readonly HyetographPiece[], windowMin: number): number {
  const w = windowMin * 60_000;
  const n = pieces.length;
  if (n === 0) return 0;
  // cumulative depth at each piece start
  const cumAtStart = new Float64Array(n + 1);
  for (let k = 0; k < n; k++) {
    cumAtStart[k + 1] = cumAtStart[k]! + pieces[k]!.depthMm;
  }
  const cumAt = (t: number, hint: { k: number }): number => {
    // advance hint to the last piece starting at or before t
    while (hint.k + 1 < n && pieces[hint.k + 1]!.startMs <= t) hint.k++;
    while (hint.k > 0 && pieces[hint.k]!.startMs > t) hint.k--;
    const p = pieces[hint.k]!;
    if (t <= p.startMs) return cumAtStart[hint.k]!;
    if (t >= p.endMs) return cumAtStart[hint.k + 1]!;
    const dur = p.endMs - p.startMs;
    return cumAtStart[hint.k]! + (dur > 0 ? (p.depthMm * (t - p.startMs)) / dur : p.depthMm);
  };
  let best = 0;
  const h1 = { k: 0 };
  const h2 = { k: 0 };
  for (let k = 0; k < n; k++) {
    const p = pieces[k]!;
    // windows that start, or end, at this piece's start or end
    for (const t0 of [p.startMs, p.endMs, p.startMs - w, p.endMs - w]) {
      const d = cumAt(t0 + w, h2) - cumAt(t0, h1);
      if (d > best) best = d;
    }
  }
  return best;
}

/** Energy and erosivity of one storm. */
export interface StormEnergy {
  depthMm: number;
  durationH: number;
  /** storm kinetic energy E, MJ ha⁻¹ */
  energyMJha: number;
  /** maximum 30-minute intensity I30, mm h⁻¹ (twice the depth when the storm is shorter than 30 min) */
  i30MmH: number;
  /** EI30, MJ mm ha⁻¹ h⁻¹ */
  ei30: number;
  peakIntensityMmH: number;
  /** meets the RUSLE erosive-storm rule: at least 12.7 mm, or at least 6.35 mm in 15 min */
  erosive: boolean;
}

/**
 * Kinetic energy and erosivity of a storm from its hyetograph: E = Σ e(i_k) ΔV_k, I30 the greatest
 * 30-minute depth × 2, EI30 = E · I30 (Wischmeier and Smith 1978; Renard et al. 1997 for the
 * erosive-storm rule).
 */
export function stormEnergy(pieces: readonly HyetographPiece[], method: KineticEnergyMethod = "mcgregor-1995"): StormEnergy {
  let depth = 0;
  let energy = 0;
  let peak = 0;
  let start = Infinity;
  let end = -Infinity;
  for (const p of pieces) {
    const dur = (p.endMs - p.startMs) / 3_600_000;
    const i = dur > 0 ? p.depthMm / dur : 0;
    depth += p.depthMm;
    energy += unitKineticEnergyMJhaMm(i, method) * p.depthMm;
    if (i > peak) peak = i;
    if (p.startMs < start) start = p.startMs;
    if (p.endMs > end) end = p.endMs;
  }
  const i30 = 2 * maxDepthInWindowMm(pieces, 30);
  const max15 = maxDepthInWindowMm(pieces, 15);
  return {
    depthMm: depth,
    durationH: pieces.length ? (end - start) / 3_600_000 : 0,
    energyMJha: energy,
    i30MmH: i30,
    ei30: energy * i30,
    peakIntensityMmH: peak,
    erosive: depth >= 12.7 || max15 >= 6.35,
  };
}

/** Options for the surface-sealing flag. */
export interface SealingOptions {
  /** storm energy on bare soil that starts a seal, MJ ha⁻¹ (default 2, about 200 J m⁻²; common practice, no source) */
  energyThresholdMJha?: number;
  /** multiplier on Green-Ampt K while sealed (default 0.5; common practice, no source) */
  ksatFactor?: number;
  /** days the seal lasts (default 7; common practice, no source) */
  days?: number;
}

/**
 * Whether a storm seals a bare surface: high kinetic energy on soil with little cover forms a crust
 * that lowers infiltration for the following days. Returns the K multiplier and how long it lasts,
 * or null when no seal forms.
 */
export function surfaceSealing(storm: Pick<StormEnergy, "energyMJha">, bareSoil: boolean, options: SealingOptions = {}): { ksatFactor: number; days: number } | null {
  if (!bareSoil) return null;
  if (storm.energyMJha < (options.energyThresholdMJha ?? 2)) return null;
  return { ksatFactor: options.ksatFactor ?? 0.5, days: options.days ?? 7 };
}
