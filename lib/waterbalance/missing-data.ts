import { MJ_M2_TO_MM } from "./units";
import {
  saturationVapourPressureKPa,
  vapourPressureFromDewpointKPa,
  vapourPressureFromRhMaxKPa,
  vapourPressureFromRhMaxMinKPa,
  vapourPressureFromRhMeanKPa,
  vapourPressureFromTminKPa,
  windAt2mMs,
} from "./meteo";
import { solarFromSunshineMJm2, solarFromTemperatureRangeMJm2 } from "./solar";
import type { DailyWeather, StationSite } from "./reference-et";

/** FAO-56 chapter 3 "missing data" procedures, and the order in which measured inputs are preferred. */

/** Where the day's ea came from. */
export type HumiditySource = "measured-ea" | "dewpoint" | "rh-max-min" | "rh-max" | "rh-mean" | "tmin" | "none";
/** Where the day's Rs came from. */
export type SolarSource = "measured" | "sunshine" | "temperature-range" | "none";
/** Where the day's u2 came from. */
export type WindSource = "measured" | "default" | "none";

/**
 * Actual vapour pressure for the day, most reliable source first (FAO-56 chapter 3):
 * measured ea, dewpoint (eq. 14), RHmax and RHmin (eq. 17), RHmax (eq. 18), RHmean (eq. 19),
 * else dewpoint ≈ Tmin − `dewpointDepressionC` (eq. 48), flagged as estimated.
 */
export function resolveHumidity(
  w: DailyWeather,
  dewpointDepressionC: number,
): { eaKPa: number; source: HumiditySource; estimated: boolean } {
  if (w.eaKPa !== undefined) return { eaKPa: w.eaKPa, source: "measured-ea", estimated: false };
  if (w.tDewC !== undefined) return { eaKPa: vapourPressureFromDewpointKPa(w.tDewC), source: "dewpoint", estimated: false };
  if (w.rhMaxPct !== undefined && w.rhMinPct !== undefined) {
    return { eaKPa: vapourPressureFromRhMaxMinKPa(w.tMaxC, w.tMinC, w.rhMaxPct, w.rhMinPct), source: "rh-max-min", estimated: false };
  }
  if (w.rhMaxPct !== undefined) return { eaKPa: vapourPressureFromRhMaxKPa(w.tMinC, w.rhMaxPct), source: "rh-max", estimated: false };
  if (w.rhMeanPct !== undefined) {
    return { eaKPa: vapourPressureFromRhMeanKPa(w.tMaxC, w.tMinC, w.rhMeanPct), source: "rh-mean", estimated: false };
  }
  // ea can never exceed e°(Tmin) on a day whose minimum is Tmin.
  const ea = Math.min(vapourPressureFromTminKPa(w.tMinC, dewpointDepressionC), saturationVapourPressureKPa(w.tMinC));
  return { eaKPa: ea, source: "tmin", estimated: true };
}

/**
 * Solar radiation for the day: measured Rs, else from sunshine hours (FAO-56 eq. 35), else from the
 * temperature range (eq. 50, kRs 0.16 interior / 0.19 coastal), flagged as estimated.
 */
export function resolveSolar(
  w: DailyWeather,
  site: StationSite,
  raMJm2: number,
  daylightH: number,
): { rsMJm2: number; source: SolarSource; estimated: boolean } {
  if (w.solarMJm2 !== undefined) return { rsMJm2: w.solarMJm2, source: "measured", estimated: false };
  if (w.sunshineHours !== undefined) {
    return {
      rsMJm2: solarFromSunshineMJm2(w.sunshineHours, daylightH, raMJm2, { as: site.angstromA, bs: site.angstromB }),
      source: "sunshine",
      estimated: false,
    };
  }
  return {
    rsMJm2: solarFromTemperatureRangeMJm2(w.tMaxC, w.tMinC, raMJm2, {
      coastal: site.coastal,
      kRs: site.kRs,
      elevationM: site.elevationM,
    }),
    source: "temperature-range",
    estimated: true,
  };
}

/** Wind at 2 m: measured (converted from its height by FAO-56 eq. 47), else `defaultWindMs` (2 m/s), estimated. */
export function resolveWind(
  w: DailyWeather,
  site: StationSite,
  defaultWindMs: number,
): { u2Ms: number; source: WindSource; estimated: boolean } {
  if (w.windMs === undefined) return { u2Ms: defaultWindMs, source: "default", estimated: true };
  const h = w.windHeightM ?? site.windHeightM ?? 2;
  return { u2Ms: h === 2 ? w.windMs : windAt2mMs(w.windMs, h), source: "measured", estimated: false };
}

/**
 * Hargreaves reference ET (mm d⁻¹), FAO-56 eq. 52, for days with temperatures only:
 * ETo = 0.0023 (Tmean + 17.8) (Tmax − Tmin)^0.5 · 0.408 Ra, Ra in MJ m⁻² d⁻¹.
 */
export function hargreavesEtoMm(tMaxC: number, tMinC: number, raMJm2: number): number {
  const tMean = (tMaxC + tMinC) / 2;
  return 0.0023 * (tMean + 17.8) * Math.sqrt(Math.max(0, tMaxC - tMinC)) * MJ_M2_TO_MM * raMJm2;
}
