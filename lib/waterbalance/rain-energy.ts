import { scratchFloat64, SCRATCH_CUMULATIVE } from "./arrays";
import { requireNonNegative } from "./errors";
import { piecesToScratchColumns, type HyetographColumns, type HyetographPiece } from "./storms";

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
export function unitKineticEnergyMJhaMm(
  intensityMmH: number,
  method: KineticEnergyMethod = "mcgregor-1995",
): number {
  if (!(intensityMmH >= 0)) requireNonNegative("intensityMmH", intensityMmH);
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
 * each piece (pieces in time order, not overlapping). The depth in a sliding window is piecewise
 * linear in its position, so the best window starts or ends at a piece boundary; both families are
 * swept with a forward pointer, O(n).
 */
export function maxDepthInWindowMm(pieces: readonly HyetographPiece[], windowMin: number): number {
  const h = piecesToScratchColumns(pieces);
  const cum = cumulative(h, 0, h.n);
  return maxWindow(h, 0, h.n, cum, windowMin * 60_000);
}

/** Running depth at piece starts: cum[j] is the depth before piece from + j (reused scratch). */
function cumulative(h: HyetographColumns, from: number, to: number): Float64Array {
  const cum = scratchFloat64(SCRATCH_CUMULATIVE, to - from + 1);
  cum[0] = 0;
  for (let k = from; k < to; k++) cum[k - from + 1] = cum[k - from]! + h.depthMm[k]!;
  return cum;
}

function maxWindow(h: HyetographColumns, from: number, to: number, cum: Float64Array, w: number): number {
  const n = to - from;
  const s = h.startMs;
  const e = h.endMs;
  let best = 0;
  for (let pass = 0; pass < 2; pass++) {
    // pass 0: windows starting at each boundary, C(b + w) − C(b); pass 1: ending there, C(b) − C(b − w)
    const shift = pass === 0 ? w : -w;
    let j = 0;
    for (let k = 0; k < 2 * n; k++) {
      const q = k >> 1;
      const b = k & 1 ? e[from + q]! : s[from + q]!;
      const cb = cum[q + (k & 1)]!;
      const t = b + shift;
      while (j < n && e[from + j]! <= t) j++;
      let ct: number;
      if (j >= n) ct = cum[n]!;
      else {
        const ps = s[from + j]!;
        if (t <= ps) ct = cum[j]!;
        else {
          const dur = e[from + j]! - ps;
          ct = cum[j]! + (dur > 0 ? (h.depthMm[from + j]! * (t - ps)) / dur : 0);
        }
      }
      const d = pass === 0 ? ct - cb : cb - ct;
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
export function stormEnergy(
  pieces: readonly HyetographPiece[],
  method: KineticEnergyMethod = "mcgregor-1995",
): StormEnergy {
  const h = piecesToScratchColumns(pieces);
  return stormEnergyColumns(h, 0, h.n, method);
}

/** {@link stormEnergy} on pieces `from`..`to` (exclusive) of a columnar hyetograph. */
export function stormEnergyColumns(
  h: HyetographColumns,
  from: number,
  to: number,
  method: KineticEnergyMethod = "mcgregor-1995",
): StormEnergy {
  const n = to - from;
  let energy = 0;
  let peak = 0;
  let start = Infinity;
  let end = -Infinity;
  for (let k = from; k < to; k++) {
    const depth = h.depthMm[k]!;
    const s = h.startMs[k]!;
    const e = h.endMs[k]!;
    const durH = (e - s) / 3_600_000;
    const i = durH > 0 ? depth / durH : 0;
    energy += unitKineticEnergyMJhaMm(i, method) * depth;
    if (i > peak) peak = i;
    if (s < start) start = s;
    if (e > end) end = e;
  }
  const cum = cumulative(h, from, to);
  const depth = cum[n]!;
  const i30 = n ? 2 * maxWindow(h, from, to, cum, 30 * 60_000) : 0;
  // RUSLE's 15-minute rule only matters for storms under 12.7 mm
  const erosive = depth >= 12.7 || (n > 0 && maxWindow(h, from, to, cum, 15 * 60_000) >= 6.35);
  return {
    depthMm: depth,
    durationH: n ? (end - start) / 3_600_000 : 0,
    energyMJha: energy,
    i30MmH: i30,
    ei30: energy * i30,
    peakIntensityMmH: peak,
    erosive,
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
export function surfaceSealing(
  storm: Pick<StormEnergy, "energyMJha">,
  bareSoil: boolean,
  options: SealingOptions = {},
): { ksatFactor: number; days: number } | null {
  if (!bareSoil) return null;
  if (storm.energyMJha < (options.energyThresholdMJha ?? 2)) return null;
  return { ksatFactor: options.ksatFactor ?? 0.5, days: options.days ?? 7 };
}
