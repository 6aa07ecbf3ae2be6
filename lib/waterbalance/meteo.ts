import { requireFinite, requirePositive, requireRange, WaterBalanceInputError } from "./errors";

/** FAO-56 chapter 3: atmospheric pressure, psychrometric constant, vapour pressure and wind height. */

/**
 * Atmospheric pressure (kPa) at elevation `elevationM` above sea level, FAO-56 eq. 7
 * (simplified ideal gas law at 20 °C standard atmosphere).
 */
export function atmosphericPressureKPa(elevationM: number): number {
  requireRange("elevationM", elevationM, -500, 9000);
  return 101.3 * Math.pow((293 - 0.0065 * elevationM) / 293, 5.26);
}

/** Psychrometric constant γ (kPa °C⁻¹) from pressure `pressureKPa`, FAO-56 eq. 8. */
export function psychrometricConstantKPaC(pressureKPa: number): number {
  return 0.000665 * pressureKPa;
}

/** Saturation vapour pressure e°(T) (kPa) at air temperature `tempC`, FAO-56 eq. 11 (Tetens form). */
export function saturationVapourPressureKPa(tempC: number): number {
  return 0.6108 * Math.exp((17.27 * tempC) / (tempC + 237.3));
}

/** Slope Δ of the saturation vapour pressure curve (kPa °C⁻¹) at `tempC`, FAO-56 eq. 13. */
export function saturationSlopeKPaC(tempC: number): number {
  const t = tempC + 237.3;
  return (4098 * saturationVapourPressureKPa(tempC)) / (t * t);
}

/** Mean saturation vapour pressure es (kPa) for a day, FAO-56 eq. 12: mean of e°(Tmax) and e°(Tmin). */
export function meanSaturationVapourPressureKPa(tMaxC: number, tMinC: number): number {
  return (saturationVapourPressureKPa(tMaxC) + saturationVapourPressureKPa(tMinC)) / 2;
}

/** Actual vapour pressure ea (kPa) from dewpoint `tDewC`, FAO-56 eq. 14. */
export function vapourPressureFromDewpointKPa(tDewC: number): number {
  return saturationVapourPressureKPa(tDewC);
}

/**
 * Actual vapour pressure ea (kPa) from RHmax and RHmin (%), FAO-56 eq. 17:
 * ea = [e°(Tmin) RHmax/100 + e°(Tmax) RHmin/100] / 2.
 */
export function vapourPressureFromRhMaxMinKPa(
  tMaxC: number,
  tMinC: number,
  rhMaxPct: number,
  rhMinPct: number,
): number {
  requireRange("rhMaxPct", rhMaxPct, 0, 100);
  requireRange("rhMinPct", rhMinPct, 0, 100);
  return (
    (saturationVapourPressureKPa(tMinC) * (rhMaxPct / 100) +
      saturationVapourPressureKPa(tMaxC) * (rhMinPct / 100)) /
    2
  );
}

/** Actual vapour pressure ea (kPa) from RHmax alone (%), FAO-56 eq. 18: ea = e°(Tmin) RHmax/100. */
export function vapourPressureFromRhMaxKPa(tMinC: number, rhMaxPct: number): number {
  requireRange("rhMaxPct", rhMaxPct, 0, 100);
  return saturationVapourPressureKPa(tMinC) * (rhMaxPct / 100);
}

/** Actual vapour pressure ea (kPa) from mean RH (%), FAO-56 eq. 19: ea = RHmean/100 · es. */
export function vapourPressureFromRhMeanKPa(tMaxC: number, tMinC: number, rhMeanPct: number): number {
  requireRange("rhMeanPct", rhMeanPct, 0, 100);
  return (rhMeanPct / 100) * meanSaturationVapourPressureKPa(tMaxC, tMinC);
}

/**
 * Actual vapour pressure ea (kPa) when humidity is missing: dewpoint taken as Tmin less
 * `dewpointDepressionC` (0 in humid climates, 2-3 °C in arid ones), FAO-56 eq. 48 and chapter 3
 * "missing humidity data".
 */
export function vapourPressureFromTminKPa(tMinC: number, dewpointDepressionC = 0): number {
  return saturationVapourPressureKPa(tMinC - dewpointDepressionC);
}

/**
 * Wind speed at 2 m (m/s) from a reading `windMs` at `heightM` above the ground, FAO-56 eq. 47
 * (logarithmic profile over short grass): u2 = uz · 4.87 / ln(67.8 z − 5.42).
 */
export function windAt2mMs(windMs: number, heightM: number): number {
  requireFinite("windMs", windMs);
  if (windMs < 0) throw new WaterBalanceInputError("windMs", `must not be negative (got ${windMs})`);
  requirePositive("windHeightM", heightM);
  if (67.8 * heightM - 5.42 <= 1) {
    throw new WaterBalanceInputError("windHeightM", `must be above about 0.1 m (got ${heightM})`);
  }
  return (windMs * 4.87) / Math.log(67.8 * heightM - 5.42);
}
