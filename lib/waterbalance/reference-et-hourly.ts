import { dayOfYear } from "./dates";
import { requireNonNegative, requireRange } from "./errors";
import {
  atmosphericPressureKPa,
  psychrometricConstantKPaC,
  saturationSlopeKPaC,
  saturationVapourPressureKPa,
  windAt2mMs,
} from "./meteo";
import {
  cloudinessFactor,
  inverseRelativeDistance,
  REFERENCE_ALBEDO,
  solarDeclinationRad,
  SOLAR_CONSTANT_MJ_M2_MIN,
  sunsetHourAngleRad,
} from "./solar";

/** FAO-56 hourly Penman-Monteith (eq. 53) for logger data, with the hourly radiation terms (eq. 28-33). */

/** Stefan-Boltzmann constant per hour, MJ K⁻⁴ m⁻² h⁻¹ (FAO-56 eq. 39 divided by 24). */
export const STEFAN_BOLTZMANN_MJ_HOUR = 2.043e-10;

/** Seasonal correction for solar time Sc (hours), FAO-56 eq. 32-33. */
export function seasonalCorrectionHours(doy: number): number {
  const b = (2 * Math.PI * (doy - 81)) / 364;
  return 0.1645 * Math.sin(2 * b) - 0.1255 * Math.cos(b) - 0.025 * Math.sin(b);
}

/**
 * Solar time angle ω (rad) at the midpoint of a period, FAO-56 eq. 31, written with east-positive
 * longitudes: ω = π/12 [(t + (longitudeDeg − 15·utcOffsetHours)/15 + Sc) − 12].
 * @param standardHourMid local standard clock time at the midpoint of the period, h (14.5 for 14-15 h)
 * @param longitudeDeg site longitude, degrees east positive (FAO-56 uses degrees west; the sign flips)
 * @param utcOffsetHours offset of the local standard time zone from UTC, h (FAO-56 Lz = −15·offset °W)
 */
export function solarTimeAngleRad(
  standardHourMid: number,
  longitudeDeg: number,
  utcOffsetHours: number,
  doy: number,
): number {
  const t = standardHourMid + 0.06667 * (longitudeDeg - 15 * utcOffsetHours) + seasonalCorrectionHours(doy);
  return (Math.PI / 12) * (t - 12);
}

/**
 * Extraterrestrial radiation for a period of `periodHours` around solar time angle ω (MJ m⁻² per
 * period), FAO-56 eq. 28-30, with ω1 and ω2 held within ±ωs so partial sunrise and sunset hours count.
 */
export function extraterrestrialRadiationPeriodMJm2(
  latitudeDeg: number,
  doy: number,
  omegaRad: number,
  periodHours = 1,
): number {
  requireRange("latitudeDeg", latitudeDeg, -90, 90);
  const phi = (latitudeDeg * Math.PI) / 180;
  const dr = inverseRelativeDistance(doy);
  const decl = solarDeclinationRad(doy);
  const ws = sunsetHourAngleRad(phi, decl);
  const half = (Math.PI * periodHours) / 24;
  let w1 = omegaRad - half;
  let w2 = omegaRad + half;
  // wrap into (−π, π] so a midnight hour does not sit outside the day
  while (w1 > Math.PI) {
    w1 -= 2 * Math.PI;
    w2 -= 2 * Math.PI;
  }
  while (w2 < -Math.PI) {
    w1 += 2 * Math.PI;
    w2 += 2 * Math.PI;
  }
  w1 = Math.max(-ws, Math.min(ws, w1));
  w2 = Math.max(-ws, Math.min(ws, w2));
  if (w2 <= w1) return 0;
  const ra =
    ((12 * 60) / Math.PI) *
    SOLAR_CONSTANT_MJ_M2_MIN *
    dr *
    ((w2 - w1) * Math.sin(phi) * Math.sin(decl) +
      Math.cos(phi) * Math.cos(decl) * (Math.sin(w2) - Math.sin(w1)));
  return Math.max(0, ra);
}

/** One hour of logger data. */
export interface HourlyWeather {
  /** ISO local date of the hour */
  date: string;
  /** local standard clock time at the middle of the hour, h (e.g. 14.5 for 14:00-15:00) */
  standardHourMid: number;
  /** mean air temperature of the hour, °C */
  tempC: number;
  /** mean relative humidity of the hour, % */
  rhPct: number;
  /** mean wind speed at `windHeightM`, m/s */
  windMs: number;
  /** anemometer height, m (default 2) */
  windHeightM?: number;
  /** solar radiation received in the hour, MJ m⁻² h⁻¹ */
  solarMJm2: number;
}

/** Site of an hourly station. */
export interface HourlySite {
  latitudeDeg: number;
  /** longitude, degrees east positive */
  longitudeDeg: number;
  elevationM: number;
  /** offset of local standard time from UTC, h (no daylight saving) */
  utcOffsetHours: number;
}

/** Hourly ETo (mm h⁻¹) and every intermediate of FAO-56 eq. 53. */
export interface HourlyEtoResult {
  etoMm: number;
  daytime: boolean;
  doy: number;
  omegaRad: number;
  pressureKPa: number;
  gammaKPaC: number;
  deltaKPaC: number;
  eSatKPa: number;
  eaKPa: number;
  raMJm2: number;
  rsoMJm2: number;
  rsOverRso: number;
  rnsMJm2: number;
  rnlMJm2: number;
  rnMJm2: number;
  gMJm2: number;
  u2Ms: number;
}

/**
 * FAO-56 hourly Penman-Monteith reference ET (mm h⁻¹), eq. 53:
 * ETo = [0.408 Δ (Rn − G) + γ 37/(Thr + 273) u2 (e°(Thr) − ea)] / [Δ + γ (1 + 0.34 u2)],
 * ea = e°(Thr) RH/100 (eq. 54), G = 0.1 Rn by day and 0.5 Rn by night (eq. 45-46), Rnl per hour
 * (eq. 39 with σ = 2.043e-10) using Rs/Rso held at `rsOverRsoDark` when the sun is down.
 * @param options.rsOverRsoDark Rs/Rso for dark hours: FAO-56 takes the value 2-3 h before sunset; default 0.8, as Example 19 uses for its arid night
 */
export function referenceEtHourly(
  w: HourlyWeather,
  site: HourlySite,
  options: { rsOverRsoDark?: number } = {},
): HourlyEtoResult {
  requireRange("latitudeDeg", site.latitudeDeg, -90, 90);
  requireRange("longitudeDeg", site.longitudeDeg, -180, 180);
  requireRange("rhPct", w.rhPct, 0, 100);
  requireRange("tempC", w.tempC, -60, 60);
  requireRange("standardHourMid", w.standardHourMid, 0, 24);
  requireNonNegative("windMs", w.windMs);
  requireNonNegative("solarMJm2", w.solarMJm2);
  const doy = dayOfYear(w.date);
  const omegaRad = solarTimeAngleRad(w.standardHourMid, site.longitudeDeg, site.utcOffsetHours, doy);
  const raMJm2 = extraterrestrialRadiationPeriodMJm2(site.latitudeDeg, doy, omegaRad, 1);
  const rsoMJm2 = (0.75 + 2e-5 * site.elevationM) * raMJm2;
  const daytime = raMJm2 > 0.001 && w.solarMJm2 > 0;
  const rsOverRso =
    daytime && rsoMJm2 > 0 ? Math.min(1, w.solarMJm2 / rsoMJm2) : (options.rsOverRsoDark ?? 0.8);
  const pressureKPa = atmosphericPressureKPa(site.elevationM);
  const gammaKPaC = psychrometricConstantKPaC(pressureKPa);
  const deltaKPaC = saturationSlopeKPaC(w.tempC);
  const eSatKPa = saturationVapourPressureKPa(w.tempC);
  const eaKPa = (eSatKPa * w.rhPct) / 100;
  const tK = w.tempC + 273.16;
  const rnsMJm2 = (1 - REFERENCE_ALBEDO) * w.solarMJm2;
  const rnlMJm2 =
    STEFAN_BOLTZMANN_MJ_HOUR *
    tK *
    tK *
    tK *
    tK *
    (0.34 - 0.14 * Math.sqrt(eaKPa)) *
    cloudinessFactor(rsOverRso);
  const rnMJm2 = rnsMJm2 - rnlMJm2;
  const gMJm2 = (daytime ? 0.1 : 0.5) * rnMJm2;
  const u2Ms =
    w.windHeightM === undefined || w.windHeightM === 2 ? w.windMs : windAt2mMs(w.windMs, w.windHeightM);
  const num =
    0.408 * deltaKPaC * (rnMJm2 - gMJm2) + gammaKPaC * (37 / (w.tempC + 273)) * u2Ms * (eSatKPa - eaKPa);
  const eto = num / (deltaKPaC + gammaKPaC * (1 + 0.34 * u2Ms));
  return {
    etoMm: Math.max(0, eto),
    daytime,
    doy,
    omegaRad,
    pressureKPa,
    gammaKPaC,
    deltaKPaC,
    eSatKPa,
    eaKPa,
    raMJm2,
    rsoMJm2,
    rsOverRso,
    rnsMJm2,
    rnlMJm2,
    rnMJm2,
    gMJm2,
    u2Ms,
  };
}
