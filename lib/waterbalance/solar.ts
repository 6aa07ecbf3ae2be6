import { requireRange } from "./errors";

/** FAO-56 chapter 3 radiation terms for a day: Ra, N, Rs, Rso, net shortwave and longwave. */

/** Solar constant Gsc, MJ m⁻² min⁻¹ (FAO-56 eq. 21). */
export const SOLAR_CONSTANT_MJ_M2_MIN = 0.082;
/** Stefan-Boltzmann constant per day, MJ K⁻⁴ m⁻² d⁻¹ (FAO-56 eq. 39). */
export const STEFAN_BOLTZMANN_MJ_DAY = 4.903e-9;
/** Albedo of the grass reference surface (FAO-56 eq. 38). */
export const REFERENCE_ALBEDO = 0.23;

/** Inverse relative Earth-Sun distance dr for day of year `doy`, FAO-56 eq. 23. */
export function inverseRelativeDistance(doy: number): number {
  return 1 + 0.033 * Math.cos(((2 * Math.PI) / 365) * doy);
}

/** Solar declination δ (rad) for day of year `doy`, FAO-56 eq. 24. */
export function solarDeclinationRad(doy: number): number {
  return 0.409 * Math.sin(((2 * Math.PI) / 365) * doy - 1.39);
}

/**
 * Sunset hour angle ωs (rad), FAO-56 eq. 25, with the argument clipped to [-1, 1] so polar day and
 * polar night give π and 0 (FAO-56 Annex 3 note for latitudes beyond 55-66°).
 */
export function sunsetHourAngleRad(latitudeRad: number, declinationRad: number): number {
  const x = -Math.tan(latitudeRad) * Math.tan(declinationRad);
  return Math.acos(Math.min(1, Math.max(-1, x)));
}

/** Daily geometry shared by Ra and N. */
export interface SolarGeometry {
  /** day of year */
  doy: number;
  /** inverse relative distance Earth-Sun, dimensionless */
  dr: number;
  /** solar declination, rad */
  declinationRad: number;
  /** sunset hour angle, rad */
  sunsetHourAngleRad: number;
}

/** dr, δ and ωs for latitude `latitudeDeg` (north positive) on day of year `doy` (FAO-56 eq. 23-25). */
export function solarGeometry(latitudeDeg: number, doy: number): SolarGeometry {
  requireRange("latitudeDeg", latitudeDeg, -90, 90);
  requireRange("doy", doy, 1, 366);
  const dr = inverseRelativeDistance(doy);
  const declinationRad = solarDeclinationRad(doy);
  return {
    doy,
    dr,
    declinationRad,
    sunsetHourAngleRad: sunsetHourAngleRad((latitudeDeg * Math.PI) / 180, declinationRad),
  };
}

/**
 * Extraterrestrial radiation Ra (MJ m⁻² d⁻¹) for latitude `latitudeDeg` on day of year `doy`,
 * FAO-56 eq. 21.
 */
export function extraterrestrialRadiationMJm2(latitudeDeg: number, doy: number): number {
  const g = solarGeometry(latitudeDeg, doy);
  return raFromGeometry(latitudeDeg, g);
}

/** Ra (MJ m⁻² d⁻¹) from a precomputed geometry, FAO-56 eq. 21. */
export function raFromGeometry(latitudeDeg: number, g: SolarGeometry): number {
  const phi = (latitudeDeg * Math.PI) / 180;
  const ws = g.sunsetHourAngleRad;
  const ra =
    ((24 * 60) / Math.PI) *
    SOLAR_CONSTANT_MJ_M2_MIN *
    g.dr *
    (ws * Math.sin(phi) * Math.sin(g.declinationRad) +
      Math.cos(phi) * Math.cos(g.declinationRad) * Math.sin(ws));
  return Math.max(0, ra);
}

/** Daylight hours N for latitude `latitudeDeg` on day of year `doy`, FAO-56 eq. 34. */
export function daylightHours(latitudeDeg: number, doy: number): number {
  return (24 / Math.PI) * solarGeometry(latitudeDeg, doy).sunsetHourAngleRad;
}

/**
 * Solar radiation Rs (MJ m⁻² d⁻¹) from `sunshineHours` n of bright sunshine, FAO-56 eq. 35
 * (Angstrom): Rs = (as + bs n/N) Ra, as = 0.25, bs = 0.50 unless calibrated.
 */
export function solarFromSunshineMJm2(
  sunshineHours: number,
  daylightH: number,
  raMJm2: number,
  options: { as?: number; bs?: number } = {},
): number {
  const as = options.as ?? 0.25;
  const bs = options.bs ?? 0.5;
  requireRange("sunshineHours", sunshineHours, 0, 24);
  const ratio = daylightH > 0 ? Math.min(1, sunshineHours / daylightH) : 0;
  return (as + bs * ratio) * raMJm2;
}

/**
 * Solar radiation Rs (MJ m⁻² d⁻¹) from the daily temperature range, FAO-56 eq. 50 (Hargreaves'
 * radiation formula): Rs = kRs √(Tmax − Tmin) Ra, kRs = 0.16 interior, 0.19 coastal. Limited to Rso
 * ((0.75 + 2e-5 z) Ra) as FAO-56 chapter 3 advises.
 */
export function solarFromTemperatureRangeMJm2(
  tMaxC: number,
  tMinC: number,
  raMJm2: number,
  options: { coastal?: boolean; kRs?: number; elevationM?: number } = {},
): number {
  const kRs = options.kRs ?? (options.coastal ? 0.19 : 0.16);
  const rs = kRs * Math.sqrt(Math.max(0, tMaxC - tMinC)) * raMJm2;
  return Math.min(rs, clearSkySolarMJm2(raMJm2, options.elevationM ?? 0));
}

/** Clear-sky solar radiation Rso (MJ m⁻² d⁻¹), FAO-56 eq. 37: Rso = (0.75 + 2·10⁻⁵ z) Ra. */
export function clearSkySolarMJm2(raMJm2: number, elevationM: number): number {
  return (0.75 + 2e-5 * elevationM) * raMJm2;
}

/** Net shortwave radiation Rns (MJ m⁻² d⁻¹), FAO-56 eq. 38 with albedo 0.23. */
export function netShortwaveMJm2(solarMJm2: number, albedo = REFERENCE_ALBEDO): number {
  return (1 - albedo) * solarMJm2;
}

/**
 * Cloudiness factor (1.35 Rs/Rso − 0.35) of FAO-56 eq. 39, with Rs/Rso ≤ 1 (FAO-56) and the factor kept
 * within 0.05-1.0 (ASCE-EWRI 2005, from memory) so a dark day never gains longwave.
 */
export function cloudinessFactor(rsOverRso: number): number {
  const f = 1.35 * Math.min(1, rsOverRso) - 0.35;
  return Math.min(1, Math.max(0.05, f));
}

/**
 * Net longwave radiation Rnl (MJ m⁻² d⁻¹), FAO-56 eq. 39:
 * Rnl = σ [(Tmax,K⁴ + Tmin,K⁴)/2] (0.34 − 0.14 √ea) (1.35 Rs/Rso − 0.35).
 */
export function netLongwaveMJm2(
  tMaxC: number,
  tMinC: number,
  eaKPa: number,
  solarMJm2: number,
  clearSkyMJm2: number,
): number {
  const tMaxK = tMaxC + 273.16;
  const tMinK = tMinC + 273.16;
  const tMax4 = tMaxK * tMaxK * tMaxK * tMaxK;
  const tMin4 = tMinK * tMinK * tMinK * tMinK;
  const ratio = clearSkyMJm2 > 0 ? solarMJm2 / clearSkyMJm2 : 1;
  return (
    STEFAN_BOLTZMANN_MJ_DAY *
    ((tMax4 + tMin4) / 2) *
    (0.34 - 0.14 * Math.sqrt(Math.max(0, eaKPa))) *
    cloudinessFactor(ratio)
  );
}

/**
 * Monthly soil heat flux G (MJ m⁻² d⁻¹), FAO-56 eq. 43 (with next month) or eq. 44 (without):
 * G = 0.07 (T next − T previous), or 0.14 (T this − T previous). Daily G is taken as 0 (eq. 42).
 */
export function monthlySoilHeatFluxMJm2(
  tPrevMonthC: number,
  tThisMonthC: number,
  tNextMonthC?: number,
): number {
  return tNextMonthC === undefined ? 0.14 * (tThisMonthC - tPrevMonthC) : 0.07 * (tNextMonthC - tPrevMonthC);
}
