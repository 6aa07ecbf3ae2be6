import { MJ_M2_TO_MM } from "./units";
import { saturationVapourPressureKPa, windAt2mMs } from "./meteo";
import { solarFromSunshineMJm2, solarFromTemperatureRangeMJm2 } from "./solar";
import type { DailyWeather, StationSite } from "./reference-et";

/** FAO-56 chapter 3 "missing data" procedures, and the order in which measured inputs are preferred. */

/** Where the day's ea came from. */
export type HumiditySource =
  "measured-ea" | "dewpoint" | "rh-max-min" | "rh-max" | "rh-mean" | "tmin" | "none";
/** Where the day's Rs came from. */
export type SolarSource = "measured" | "sunshine" | "temperature-range" | "none";
/** Where the day's u2 came from. */
export type WindSource = "measured" | "default" | "none";

/** The day's filled inputs (a reusable scratch record; see {@link fillDailyInputs}). */
export interface FilledInputs {
  eaKPa: number;
  humiditySource: HumiditySource;
  rsMJm2: number;
  solarSource: SolarSource;
  u2Ms: number;
  windSource: WindSource;
}

/** An empty {@link FilledInputs} record to fill. */
export function emptyFilledInputs(): FilledInputs {
  return { eaKPa: 0, humiditySource: "none", rsMJm2: 0, solarSource: "none", u2Ms: 0, windSource: "none" };
}

/**
 * Fills the day's ea, Rs and u2, most reliable source first (FAO-56 chapter 3):
 * - ea: measured, dewpoint (eq. 14), RHmax and RHmin (eq. 17), RHmax (eq. 18), RHmean (eq. 19), else
 *   dewpoint ≈ Tmin − `dewpointDepressionC` (eq. 48, estimated);
 * - Rs: measured, sunshine hours (eq. 35), else the temperature range (eq. 50, kRs 0.16 interior /
 *   0.19 coastal, estimated);
 * - u2: measured at any height (eq. 47), else `defaultWindMs` (2 m/s, estimated).
 * Writes into `out` so a season can be filled without allocating per day.
 */
export function fillDailyInputs(
  w: DailyWeather,
  site: StationSite,
  raMJm2: number,
  daylightH: number,
  defaultWindMs: number,
  out: FilledInputs,
): FilledInputs {
  const eMax = saturationVapourPressureKPa(w.tMaxC);
  const eMin = saturationVapourPressureKPa(w.tMinC);
  if (w.eaKPa !== undefined) {
    out.eaKPa = w.eaKPa;
    out.humiditySource = "measured-ea";
  } else if (w.tDewC !== undefined) {
    out.eaKPa = saturationVapourPressureKPa(w.tDewC);
    out.humiditySource = "dewpoint";
  } else if (w.rhMaxPct !== undefined && w.rhMinPct !== undefined) {
    out.eaKPa = (eMin * w.rhMaxPct + eMax * w.rhMinPct) / 200;
    out.humiditySource = "rh-max-min";
  } else if (w.rhMaxPct !== undefined) {
    out.eaKPa = (eMin * w.rhMaxPct) / 100;
    out.humiditySource = "rh-max";
  } else if (w.rhMeanPct !== undefined) {
    out.eaKPa = ((w.rhMeanPct / 100) * (eMax + eMin)) / 2;
    out.humiditySource = "rh-mean";
  } else {
    // ea can never exceed e°(Tmin) on a day whose minimum is Tmin
    const dep = site.dewpointDepressionC ?? 0;
    out.eaKPa = dep > 0 ? saturationVapourPressureKPa(w.tMinC - dep) : eMin;
    out.humiditySource = "tmin";
  }
  if (w.solarMJm2 !== undefined) {
    out.rsMJm2 = w.solarMJm2;
    out.solarSource = "measured";
  } else if (w.sunshineHours !== undefined) {
    out.rsMJm2 = solarFromSunshineMJm2(w.sunshineHours, daylightH, raMJm2, {
      as: site.angstromA,
      bs: site.angstromB,
    });
    out.solarSource = "sunshine";
  } else {
    out.rsMJm2 = solarFromTemperatureRangeMJm2(w.tMaxC, w.tMinC, raMJm2, {
      coastal: site.coastal,
      kRs: site.kRs,
      elevationM: site.elevationM,
    });
    out.solarSource = "temperature-range";
  }
  if (w.windMs === undefined) {
    out.u2Ms = defaultWindMs;
    out.windSource = "default";
  } else {
    const h = w.windHeightM ?? site.windHeightM ?? 2;
    out.u2Ms = h === 2 ? w.windMs : windAt2mMs(w.windMs, h);
    out.windSource = "measured";
  }
  return out;
}

/**
 * Hargreaves reference ET (mm d⁻¹), FAO-56 eq. 52, for days with temperatures only:
 * ETo = 0.0023 (Tmean + 17.8) (Tmax − Tmin)^0.5 · 0.408 Ra, Ra in MJ m⁻² d⁻¹.
 */
export function hargreavesEtoMm(tMaxC: number, tMinC: number, raMJm2: number): number {
  const tMean = (tMaxC + tMinC) / 2;
  return 0.0023 * (tMean + 17.8) * Math.sqrt(Math.max(0, tMaxC - tMinC)) * MJ_M2_TO_MM * raMJm2;
}
