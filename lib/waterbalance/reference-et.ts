import { dayOfYear } from "./dates";
import { requireFinite, requireNonNegative, requireRange, WaterBalanceInputError } from "./errors";
import {
  atmosphericPressureKPa,
  psychrometricConstantKPaC,
  saturationSlopeKPaC,
  saturationVapourPressureKPa,
} from "./meteo";
import { fillDailyInputs, hargreavesEtoMm } from "./missing-data";
import type { FilledInputs, HumiditySource, SolarSource, WindSource } from "./missing-data";
import { netLongwaveMJm2, netShortwaveMJm2 } from "./solar";

/** A weather station's site: where the sun and the air pressure come from. */
export interface StationSite {
  /** latitude, decimal degrees, north positive (−90..90) */
  latitudeDeg: number;
  /** elevation above sea level, m */
  elevationM: number;
  /** within about 50 km of a large water body: kRs 0.19 instead of 0.16 (FAO-56 eq. 50) */
  coastal?: boolean;
  /** height of the anemometer, m (default 2) */
  windHeightM?: number;
  /** Angstrom coefficients for Rs from sunshine (FAO-56 eq. 35; default 0.25, 0.50) */
  angstromA?: number;
  angstromB?: number;
  /** calibrated kRs for Rs from the temperature range (FAO-56 eq. 50) */
  kRs?: number;
  /** Tmin − Tdew when humidity is missing: 0 humid (default), 2-3 °C arid (FAO-56 Annex 6) */
  dewpointDepressionC?: number;
}

/** One day's raw weather. Only the temperatures are required; the rest are used when present. */
export interface DailyWeather {
  /** ISO local date, e.g. '2026-07-06' */
  date: string;
  tMaxC: number;
  tMinC: number;
  rhMaxPct?: number;
  rhMinPct?: number;
  rhMeanPct?: number;
  tDewC?: number;
  /** measured actual vapour pressure, kPa */
  eaKPa?: number;
  /** wind speed at the station's anemometer height, m/s */
  windMs?: number;
  /** overrides the site's anemometer height for this reading, m */
  windHeightM?: number;
  /** incoming solar radiation, MJ m⁻² d⁻¹ */
  solarMJm2?: number;
  /** bright sunshine, hours */
  sunshineHours?: number;
  /** soil heat flux, MJ m⁻² d⁻¹ (0 for a day, FAO-56 eq. 42; monthly steps use eq. 43) */
  soilHeatFluxMJm2?: number;
}

/** An input the day did not have, filled by a FAO-56 chapter 3 missing-data procedure. */
export type EstimatedInput = "solar" | "humidity" | "wind";

/** Every intermediate of FAO-56 eq. 6, in the order FAO-56 Example 18 lists them. */
export interface PenmanMonteithTerms {
  doy: number;
  tMeanC: number;
  pressureKPa: number;
  gammaKPaC: number;
  deltaKPaC: number;
  eSatTMaxKPa: number;
  eSatTMinKPa: number;
  esKPa: number;
  eaKPa: number;
  vpdKPa: number;
  dr: number;
  declinationRad: number;
  sunsetHourAngleRad: number;
  raMJm2: number;
  daylightHours: number;
  rsMJm2: number;
  rsoMJm2: number;
  rnsMJm2: number;
  rnlMJm2: number;
  rnMJm2: number;
  gMJm2: number;
  u2Ms: number;
}

/** Terms of Hargreaves' equation (FAO-56 eq. 52). */
export interface HargreavesTerms {
  doy: number;
  tMeanC: number;
  raMJm2: number;
  daylightHours: number;
}

interface EtoCommon {
  /** reference ET, mm d⁻¹, never below 0 (dew is not counted as a gain) */
  etoMm: number;
  /** eq. 6 before the floor at 0, mm d⁻¹ */
  etoRawMm: number;
  /** inputs estimated rather than measured */
  estimated: EstimatedInput[];
  sources: { solar: SolarSource; humidity: HumiditySource; wind: WindSource };
}

/** The day's reference ET with the method, what was estimated, and every intermediate. */
export type DailyEtoResult =
  | (EtoCommon & { method: "penman-monteith"; terms: PenmanMonteithTerms })
  | (EtoCommon & { method: "hargreaves"; terms: HargreavesTerms });

/** Options for {@link referenceEtDaily}. */
export interface ReferenceEtOptions {
  /** what to do when only temperatures exist (default 'hargreaves', FAO-56 eq. 52) */
  temperatureOnly?: "hargreaves" | "penman-monteith";
  /** wind used when none was measured, m/s at 2 m (default 2, FAO-56 chapter 3) */
  defaultWindMs?: number;
}

/**
 * FAO-56 Penman-Monteith reference ET for a day, eq. 6:
 * ETo = [0.408 Δ (Rn − G) + γ 900/(T + 273) u2 (es − ea)] / [Δ + γ (1 + 0.34 u2)]  (mm d⁻¹).
 * All arguments in the units of {@link PenmanMonteithTerms}.
 */
export function penmanMonteithEtoMm(t: {
  tMeanC: number;
  deltaKPaC: number;
  gammaKPaC: number;
  rnMJm2: number;
  gMJm2: number;
  u2Ms: number;
  esKPa: number;
  eaKPa: number;
}): number {
  const num =
    0.408 * t.deltaKPaC * (t.rnMJm2 - t.gMJm2) +
    t.gammaKPaC * (900 / (t.tMeanC + 273)) * t.u2Ms * (t.esKPa - t.eaKPa);
  return num / (t.deltaKPaC + t.gammaKPaC * (1 + 0.34 * t.u2Ms));
}

/** Throws on a day that cannot exist (Tmax < Tmin, RH outside 0-100, negative wind or radiation). */
export function validateDailyWeather(w: DailyWeather): void {
  // the common case in one pass of plain comparisons; the checks below name what is wrong
  if (
    w.tMaxC >= -60 &&
    w.tMaxC <= 60 &&
    w.tMinC >= -70 &&
    w.tMinC <= w.tMaxC &&
    (w.rhMaxPct === undefined || (w.rhMaxPct >= 0 && w.rhMaxPct <= 100)) &&
    (w.rhMinPct === undefined ||
      (w.rhMinPct >= 0 && w.rhMinPct <= 100 && (w.rhMaxPct === undefined || w.rhMinPct <= w.rhMaxPct))) &&
    (w.rhMeanPct === undefined || (w.rhMeanPct >= 0 && w.rhMeanPct <= 100)) &&
    (w.tDewC === undefined || (w.tDewC >= -80 && w.tDewC <= 40)) &&
    (w.eaKPa === undefined || (w.eaKPa >= 0 && w.eaKPa < Infinity)) &&
    (w.windMs === undefined || (w.windMs >= 0 && w.windMs < Infinity)) &&
    (w.solarMJm2 === undefined || (w.solarMJm2 >= 0 && w.solarMJm2 < Infinity)) &&
    (w.sunshineHours === undefined || (w.sunshineHours >= 0 && w.sunshineHours <= 24)) &&
    (w.soilHeatFluxMJm2 === undefined || Number.isFinite(w.soilHeatFluxMJm2))
  ) {
    return;
  }
  requireRange("tMaxC", w.tMaxC, -60, 60);
  requireRange("tMinC", w.tMinC, -70, 60);
  if (w.tMaxC < w.tMinC) {
    throw new WaterBalanceInputError(
      "tMaxC",
      `Tmax (${w.tMaxC} °C) is below Tmin (${w.tMinC} °C) on ${w.date}`,
    );
  }
  if (w.rhMaxPct !== undefined) requireRange("rhMaxPct", w.rhMaxPct, 0, 100);
  if (w.rhMinPct !== undefined) requireRange("rhMinPct", w.rhMinPct, 0, 100);
  if (w.rhMeanPct !== undefined) requireRange("rhMeanPct", w.rhMeanPct, 0, 100);
  if (w.rhMaxPct !== undefined && w.rhMinPct !== undefined && w.rhMinPct > w.rhMaxPct) {
    throw new WaterBalanceInputError(
      "rhMinPct",
      `RHmin (${w.rhMinPct}) is above RHmax (${w.rhMaxPct}) on ${w.date}`,
    );
  }
  if (w.tDewC !== undefined) requireRange("tDewC", w.tDewC, -80, 40);
  if (w.eaKPa !== undefined) requireNonNegative("eaKPa", w.eaKPa);
  if (w.windMs !== undefined) requireNonNegative("windMs", w.windMs);
  if (w.solarMJm2 !== undefined) requireNonNegative("solarMJm2", w.solarMJm2);
  if (w.sunshineHours !== undefined) requireRange("sunshineHours", w.sunshineHours, 0, 24);
  if (w.soilHeatFluxMJm2 !== undefined) requireFinite("soilHeatFluxMJm2", w.soilHeatFluxMJm2);
}

/** Site constants a season reuses: pressure, γ, Rso factor (FAO-56 eq. 7, 8, 37). */
export interface SiteConstants {
  pressureKPa: number;
  gammaKPaC: number;
  rsoFactor: number;
}

/** Pressure, γ and the clear-sky factor of a site, computed once per season. */
export function siteConstants(site: StationSite): SiteConstants {
  requireRange("latitudeDeg", site.latitudeDeg, -90, 90);
  const pressureKPa = atmosphericPressureKPa(site.elevationM);
  return {
    pressureKPa,
    gammaKPaC: psychrometricConstantKPaC(pressureKPa),
    rsoFactor: 0.75 + 2e-5 * site.elevationM,
  };
}

/** Scratch record for {@link computeDailyEtoInto}: every term, the method and where inputs came from. */
export interface DailyEtoScratch extends PenmanMonteithTerms, FilledInputs {
  etoRawMm: number;
  method: "penman-monteith" | "hargreaves";
  /** bit 1 solar, 2 humidity, 4 wind estimated */
  estimatedMask: number;
}

/** An empty scratch record. */
export function emptyEtoScratch(): DailyEtoScratch {
  // written out in full: V8 builds a literal with a spread and many keys as a slow dictionary object
  return {
    eaKPa: 0,
    humiditySource: "none",
    rsMJm2: 0,
    solarSource: "none",
    u2Ms: 0,
    windSource: "none",
    doy: 0,
    tMeanC: 0,
    pressureKPa: 0,
    gammaKPaC: 0,
    deltaKPaC: 0,
    eSatTMaxKPa: 0,
    eSatTMinKPa: 0,
    esKPa: 0,
    vpdKPa: 0,
    dr: 0,
    declinationRad: 0,
    sunsetHourAngleRad: 0,
    raMJm2: 0,
    daylightHours: 0,
    rsoMJm2: 0,
    rnsMJm2: 0,
    rnlMJm2: 0,
    rnMJm2: 0,
    gMJm2: 0,
    etoRawMm: 0,
    method: "penman-monteith",
    estimatedMask: 0,
  };
}

/**
 * The computation behind {@link referenceEtDaily}, writing into `s` instead of allocating, for
 * season-long runs. `doy` is the day of the year; the weather must already be validated.
 */
export function computeDailyEtoInto(
  weather: DailyWeather,
  site: StationSite,
  consts: SiteConstants,
  doy: number,
  options: ReferenceEtOptions,
  s: DailyEtoScratch,
): DailyEtoScratch {
  const phi = (site.latitudeDeg * Math.PI) / 180;
  const dr = 1 + 0.033 * Math.cos(((2 * Math.PI) / 365) * doy);
  const decl = 0.409 * Math.sin(((2 * Math.PI) / 365) * doy - 1.39);
  const x = -Math.tan(phi) * Math.tan(decl);
  const ws = Math.acos(x < -1 ? -1 : x > 1 ? 1 : x);
  const raRaw =
    ((24 * 60) / Math.PI) *
    0.082 *
    dr *
    (ws * Math.sin(phi) * Math.sin(decl) + Math.cos(phi) * Math.cos(decl) * Math.sin(ws));
  const raMJm2 = raRaw > 0 ? raRaw : 0;
  const nHours = (24 / Math.PI) * ws;
  const tMeanC = (weather.tMaxC + weather.tMinC) / 2;
  s.doy = doy;
  s.tMeanC = tMeanC;
  s.dr = dr;
  s.declinationRad = decl;
  s.sunsetHourAngleRad = ws;
  s.raMJm2 = raMJm2;
  s.daylightHours = nHours;
  fillDailyInputs(weather, site, raMJm2, nHours, options.defaultWindMs ?? 2, s);
  let mask = 0;
  if (s.solarSource === "temperature-range") mask |= 1;
  if (s.humiditySource === "tmin") mask |= 2;
  if (s.windSource === "default") mask |= 4;
  s.estimatedMask = mask;
  if (mask === 7 && (options.temperatureOnly ?? "hargreaves") === "hargreaves") {
    s.method = "hargreaves";
    s.humiditySource = "none";
    s.solarSource = "none";
    s.windSource = "none";
    s.etoRawMm = hargreavesEtoMm(weather.tMaxC, weather.tMinC, raMJm2);
    return s;
  }
  s.method = "penman-monteith";
  s.pressureKPa = consts.pressureKPa;
  s.gammaKPaC = consts.gammaKPaC;
  s.deltaKPaC = saturationSlopeKPaC(tMeanC);
  s.eSatTMaxKPa = saturationVapourPressureKPa(weather.tMaxC);
  s.eSatTMinKPa = saturationVapourPressureKPa(weather.tMinC);
  s.esKPa = (s.eSatTMaxKPa + s.eSatTMinKPa) / 2;
  s.vpdKPa = s.esKPa - s.eaKPa;
  s.rsoMJm2 = consts.rsoFactor * raMJm2;
  s.rnsMJm2 = netShortwaveMJm2(s.rsMJm2);
  s.rnlMJm2 = netLongwaveMJm2(weather.tMaxC, weather.tMinC, s.eaKPa, s.rsMJm2, s.rsoMJm2);
  s.rnMJm2 = s.rnsMJm2 - s.rnlMJm2;
  s.gMJm2 = weather.soilHeatFluxMJm2 ?? 0;
  s.etoRawMm = penmanMonteithEtoMm(s);
  return s;
}

const ESTIMATED_BY_MASK: readonly EstimatedInput[][] = [0, 1, 2, 3, 4, 5, 6, 7].map((m) => {
  const out: EstimatedInput[] = [];
  if (m & 1) out.push("solar");
  if (m & 2) out.push("humidity");
  if (m & 4) out.push("wind");
  return out;
});

/** The estimated inputs named by a scratch record's mask (a fresh array). */
export function estimatedFromMask(mask: number): EstimatedInput[] {
  return [...(ESTIMATED_BY_MASK[mask & 7] ?? [])];
}

/**
 * Reference ET for one day from whatever the station measured (FAO-56 chapters 3-4).
 * Penman-Monteith (eq. 6) with FAO-56's missing-data procedures: Rs from sunshine (eq. 35) or the
 * temperature range (eq. 50), ea from humidity in the order eq. 14, 17, 18, 19, else from Tmin
 * (eq. 48), wind at 2 m by eq. 47 else 2 m/s; Hargreaves (eq. 52) when only temperatures exist.
 * @param weather the day's readings (°C, %, m/s, MJ m⁻² d⁻¹, h)
 * @param site latitude (deg), elevation (m), coastal flag, anemometer height (m)
 * @returns ETo (mm d⁻¹), the method, the list of estimated inputs and every intermediate quantity
 * @throws WaterBalanceInputError on impossible input
 */
export function referenceEtDaily(
  weather: DailyWeather,
  site: StationSite,
  options: ReferenceEtOptions = {},
): DailyEtoResult {
  const consts = siteConstants(site);
  validateDailyWeather(weather);
  const s = computeDailyEtoInto(weather, site, consts, dayOfYear(weather.date), options, emptyEtoScratch());
  const estimated = estimatedFromMask(s.estimatedMask);
  const sources = { solar: s.solarSource, humidity: s.humiditySource, wind: s.windSource };
  const eto = s.etoRawMm;
  if (s.method === "hargreaves") {
    return {
      method: "hargreaves",
      etoMm: Math.max(0, eto),
      etoRawMm: eto,
      estimated,
      sources,
      terms: { doy: s.doy, tMeanC: s.tMeanC, raMJm2: s.raMJm2, daylightHours: s.daylightHours },
    };
  }
  const terms: PenmanMonteithTerms = {
    doy: s.doy,
    tMeanC: s.tMeanC,
    pressureKPa: s.pressureKPa,
    gammaKPaC: s.gammaKPaC,
    deltaKPaC: s.deltaKPaC,
    eSatTMaxKPa: s.eSatTMaxKPa,
    eSatTMinKPa: s.eSatTMinKPa,
    esKPa: s.esKPa,
    eaKPa: s.eaKPa,
    vpdKPa: s.vpdKPa,
    dr: s.dr,
    declinationRad: s.declinationRad,
    sunsetHourAngleRad: s.sunsetHourAngleRad,
    raMJm2: s.raMJm2,
    daylightHours: s.daylightHours,
    rsMJm2: s.rsMJm2,
    rsoMJm2: s.rsoMJm2,
    rnsMJm2: s.rnsMJm2,
    rnlMJm2: s.rnlMJm2,
    rnMJm2: s.rnMJm2,
    gMJm2: s.gMJm2,
    u2Ms: s.u2Ms,
  };
  return { method: "penman-monteith", etoMm: Math.max(0, eto), etoRawMm: eto, estimated, sources, terms };
}
