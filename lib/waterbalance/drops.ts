import { requireNonNegative, requirePositive, requireRange } from "./errors";

/** Raindrops: Marshall-Palmer size distribution and terminal fall speed, for checking rain energy. */

/** Marshall and Palmer (1948) intercept N0, m⁻³ mm⁻¹. */
export const MARSHALL_PALMER_N0 = 8000;

/**
 * Largest raindrop diameter, mm: drops beyond about 1 cm break up, so size distributions are
 * truncated there (common practice, no source). Gunn and Kinzer's (1949) largest measured drop was 5.8 mm.
 */
export const MAX_RAINDROP_DIAMETER_MM = 10;

/** Largest diameter Gunn and Kinzer (1949) measured, mm; the Atlas et al. fit is used up to here. */
export const LARGEST_MEASURED_DROP_MM = 5.8;

const G = 9.80665;
const RHO_WATER = 998.2;
const RHO_AIR = 1.204;
const MU_AIR = 1.81e-5;

/** Marshall-Palmer slope Λ (mm⁻¹) for rain rate `rainMmH`: Λ = 4.1 R^−0.21 (Marshall and Palmer 1948). */
export function marshallPalmerLambdaPerMm(rainMmH: number): number {
  requirePositive("rainMmH", rainMmH);
  return 4.1 * Math.pow(rainMmH, -0.21);
}

/** Number density N(D) (m⁻³ mm⁻¹) of drops of diameter `diameterMm`: N0 exp(−Λ D) (Marshall and Palmer 1948); 0 beyond the truncation. */
export function marshallPalmerDensity(
  diameterMm: number,
  rainMmH: number,
  maxDiameterMm = MAX_RAINDROP_DIAMETER_MM,
): number {
  requireNonNegative("diameterMm", diameterMm);
  if (diameterMm > maxDiameterMm) return 0;
  return MARSHALL_PALMER_N0 * Math.exp(-marshallPalmerLambdaPerMm(rainMmH) * diameterMm);
}

/**
 * Stokes' law fall speed (m/s) of a small sphere of water of radius `radiusM` in air:
 * v = 2 (ρw − ρa) g r² / (9 μ), valid while the Reynolds number stays well below 1 (cloud droplets,
 * radius under about 30 µm). Air at 20 °C, sea level (μ = 1.81e-5 Pa s).
 */
export function stokesFallSpeedMs(radiusM: number, options: { airViscosityPaS?: number } = {}): number {
  requireNonNegative("radiusM", radiusM);
  const mu = options.airViscosityPaS ?? MU_AIR;
  return (2 * (RHO_WATER - RHO_AIR) * G * radiusM * radiusM) / (9 * mu);
}

/**
 * Fall speed (m/s) of a rigid water sphere of diameter `diameterMm` with the Schiller-Naumann (1933)
 * drag law Cd = 24/Re (1 + 0.15 Re^0.687) (from memory): it tends to Stokes' law for small drops and
 * bridges to the raindrop range, where drops are still near spherical (below about 1 mm).
 */
export function sphereFallSpeedMs(diameterMm: number): number {
  requireNonNegative("diameterMm", diameterMm);
  const d = diameterMm / 1000;
  if (d === 0) return 0;
  let v = stokesFallSpeedMs(d / 2);
  for (let it = 0; it < 100; it++) {
    const re = (RHO_AIR * v * d) / MU_AIR;
    const corr = 1 + 0.15 * Math.pow(re, 0.687);
    const vNew = stokesFallSpeedMs(d / 2) / corr;
    const next = 0.5 * (v + vNew);
    if (Math.abs(next - v) < 1e-9) return next;
    v = next;
  }
  return v;
}

/** Atlas, Srivastava and Sekhon (1973) fit to Gunn and Kinzer: v = 9.65 − 10.3 exp(−0.6 D) m/s, D in mm (good over about 0.6-5.8 mm). */
export function atlasFallSpeedMs(diameterMm: number): number {
  return 9.65 - 10.3 * Math.exp(-0.6 * diameterMm);
}

/**
 * Terminal fall speed (m/s) of a drop of diameter `diameterMm` in still air at sea level:
 * Stokes' law for cloud droplets (D < 0.04 mm), the sphere drag law from there to 0.6 mm, and the
 * Atlas et al. (1973) fit over the measured range (0.6 mm up to the largest drops, where it levels off
 * near 9.2 m/s). Diameters above {@link MAX_RAINDROP_DIAMETER_MM} are refused: such drops break up.
 */
export function terminalFallSpeedMs(diameterMm: number): number {
  requireRange("diameterMm", diameterMm, 0, MAX_RAINDROP_DIAMETER_MM);
  if (diameterMm < 0.04) return stokesFallSpeedMs(diameterMm / 2000);
  if (diameterMm < 0.6) return sphereFallSpeedMs(diameterMm);
  return atlasFallSpeedMs(diameterMm);
}

/** Bulk properties of a truncated Marshall-Palmer distribution. */
export interface DropSizeSummary {
  /** drops per m³ */
  numberPerM3: number;
  /** liquid water content, g m⁻³ */
  liquidWaterGm3: number;
  /** median volume diameter D0, mm */
  medianVolumeDiameterMm: number;
  /** rain rate the distribution delivers with {@link terminalFallSpeedMs}, mm h⁻¹ */
  rainRateMmH: number;
  /** kinetic energy flux, J m⁻² h⁻¹ */
  kineticEnergyFluxJm2H: number;
  /** kinetic energy per unit depth, MJ ha⁻¹ mm⁻¹ (comparable with the unit-energy formulas) */
  unitEnergyMJhaMm: number;
}

/**
 * Integrates the Marshall-Palmer distribution for rain rate `rainMmH`, truncated at
 * `maxDiameterMm` (default 10 mm, see {@link MAX_RAINDROP_DIAMETER_MM}), with Simpson's rule.
 */
export function marshallPalmerSummary(
  rainMmH: number,
  options: { maxDiameterMm?: number; steps?: number } = {},
): DropSizeSummary {
  const dMax = requireRange(
    "maxDiameterMm",
    options.maxDiameterMm ?? MAX_RAINDROP_DIAMETER_MM,
    0.1,
    MAX_RAINDROP_DIAMETER_MM,
  );
  const n = 2 * Math.ceil((options.steps ?? 2000) / 2);
  const lam = marshallPalmerLambdaPerMm(rainMmH);
  const h = dMax / n;
  let num = 0;
  let vol = 0;
  let flux = 0;
  let ke = 0;
  const cumVol = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) {
    const d = k * h;
    const w = k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2;
    const nd = MARSHALL_PALMER_N0 * Math.exp(-lam * d);
    const v = d > 0 ? terminalFallSpeedMs(d) : 0;
    const vDrop = (Math.PI / 6) * d * d * d; // mm³
    num += w * nd;
    vol += w * nd * vDrop;
    flux += w * nd * vDrop * v;
    ke += w * nd * vDrop * 1e-9 * RHO_WATER * 0.5 * v * v * v;
    cumVol[k] = vol;
  }
  const s = h / 3;
  num *= s;
  vol *= s;
  flux *= s;
  ke *= s;
  // median volume diameter from the running (trapezoid-accurate enough) volume sum
  let d0 = 0;
  const half = cumVol[n]! / 2;
  for (let k = 1; k <= n; k++) {
    if (cumVol[k]! >= half) {
      const lo = cumVol[k - 1]!;
      const hi = cumVol[k]!;
      d0 = (k - 1 + (hi > lo ? (half - lo) / (hi - lo) : 0)) * h;
      break;
    }
  }
  const rainRate = flux * 3.6e-3;
  const keFlux = ke * 3600;
  return {
    numberPerM3: num,
    liquidWaterGm3: vol * 1e-3,
    medianVolumeDiameterMm: d0,
    rainRateMmH: rainRate,
    kineticEnergyFluxJm2H: keFlux,
    unitEnergyMJhaMm: rainRate > 0 ? (keFlux / rainRate) * 0.01 : 0,
  };
}
