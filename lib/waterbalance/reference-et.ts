import { dayOfYear } from "./dates";
import { requireFinite, requireNonNegative, requireRange, WaterBalanceInputError } from "./errors";
import {
  atmosphericPressureKPa,
  psychrometricConstantKPaC,
  saturationSlopeKPaC,
  saturationVapourPressureKPa,
  windAt2mMs,
} from "./meteo";
import { resolveHumidity, resolveSolar, resolveWind, hargreavesEtoMm } from "./missing-data";
import type { HumiditySource, SolarSource, WindSource } from "./missing-data";
import { clearSkySolarMJm2, daylightHours, netLongwaveMJm2, netShortwaveMJm2, raFromGeometry, solarGeometry } from "./solar";

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
  const num = 0.408 * t.deltaKPaC * (t.rnMJm2 - t.gMJm2) + t.gammaKPaC * (900 / (t.tMeanC + 273)) * t.u2Ms * (t.esKPa - t.eaKPa);
  return num / (t.deltaKPaC + t.gammaKPaC * (1 + 0.34 * t.u2Ms));
}

/** Throws on a day that cannot exist (Tmax < Tmin, RH outside 0-100, negative wind or radiation). */
export function validateDailyWeather(w: DailyWeather): void {
  requireRange("tMaxC", w.tMaxC, -60, 60);
  requireRange("tMinC", w.tMinC, -70, 60);
  if (w.tMaxC < w.tMinC) {
    throw new WaterBalanceInputError("tMaxC", `Tmax (${w.tMaxC} °C) is below Tmin (${w.tMinC} °C) on ${w.date}`);
  }
  if (w.rhMaxPct !== undefined) requireRange("rhMaxPct", w.rhMaxPct, 0, 100);
  if (w.rhMinPct !== undefined) requireRange("rhMinPct", w.rhMinPct, 0, 100);
  if (w.rhMeanPct !== undefined) requireRange("rhMeanPct", w.rhMeanPct, 0, 100);
  if (w.rhMaxPct !== undefined && w.rhMinPct !== undefined && w.rhMinPct > w.rhMaxPct) {
    throw new WaterBalanceInputError("rhMinPct", `RHmin (${w.rhMinPct}) is above RHmax (${w.rhMaxPct}) on ${w.date}`);
  }
  if (w.tDewC !== undefined) requireRange("tDewC", w.tDewC, -80, 40);
  if (w.eaKPa !== undefined) requireNonNegative("eaKPa", w.eaKPa);
  if (w.windMs !== undefined) requireNonNegative("windMs", w.windMs);
  if (w.solarMJm2 !== undefined) requireNonNegative("solarMJm2", w.solarMJm2);
  if (w.sunshineHours !== undefined) requireRange("sunshineHours", w.sunshineHours, 0, 24);
  if (w.soilHeatFluxMJm2 !== undefined) requireFinite("soilHeatFluxMJm2", w.soilHeatFluxMJm2);
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
export function referenceEtDaily(weather: DailyWeather, site: StationSite, options: ReferenceEtOptions = {}): DailyEtoResult {
  requireRange("latitudeDeg", site.latitudeDeg, -90, 90);
  validateDailyWeather(weather);
  const doy = dayOfYear(weather.date);
  const g = solarGeometry(site.latitudeDeg, doy);
  const raMJm2 = raFromGeometry(site.latitudeDeg, g);
  const nHours = daylightHours(site.latitudeDeg, doy);
  const tMeanC = (weather.tMaxC + weather.tMinC) / 2;

  const humidity = resolveHumidity(weather, site.dewpointDepressionC ?? 0);
  const solar = resolveSolar(weather, site, raMJm2, nHours);
  const wind = resolveWind(weather, site, options.defaultWindMs ?? 2);

  const temperatureOnly = humidity.estimated && solar.estimated && wind.estimated;
  if (temperatureOnly && (options.temperatureOnly ?? "hargreaves") === "hargreaves") {
    const eto = hargreavesEtoMm(weather.tMaxC, weather.tMinC, raMJm2);
    return {
      method: "hargreaves",
      etoMm: Math.max(0, eto),
      etoRawMm: eto,
      estimated: ["solar", "humidity", "wind"],
      sources: { solar: "none", humidity: "none", wind: "none" },
      terms: { doy, tMeanC, raMJm2, daylightHours: nHours },
    };
  }

  const pressureKPa = atmosphericPressureKPa(site.elevationM);
  const gammaKPaC = psychrometricConstantKPaC(pressureKPa);
  const deltaKPaC = saturationSlopeKPaC(tMeanC);
  const eSatTMaxKPa = saturationVapourPressureKPa(weather.tMaxC);
  const eSatTMinKPa = saturationVapourPressureKPa(weather.tMinC);
  const esKPa = (eSatTMaxKPa + eSatTMinKPa) / 2;
  const eaKPa = humidity.eaKPa;
  const rsoMJm2 = clearSkySolarMJm2(raMJm2, site.elevationM);
  const rsMJm2 = solar.rsMJm2;
  const rnsMJm2 = netShortwaveMJm2(rsMJm2);
  const rnlMJm2 = netLongwaveMJm2(weather.tMaxC, weather.tMinC, eaKPa, rsMJm2, rsoMJm2);
  const rnMJm2 = rnsMJm2 - rnlMJm2;
  const gMJm2 = weather.soilHeatFluxMJm2 ?? 0;
  const u2Ms = wind.u2Ms;
  const terms: PenmanMonteithTerms = {
    doy,
    tMeanC,
    pressureKPa,
    gammaKPaC,
    deltaKPaC,
    eSatTMaxKPa,
    eSatTMinKPa,
    esKPa,
    eaKPa,
    vpdKPa: esKPa - eaKPa,
    dr: g.dr,
    declinationRad: g.declinationRad,
    sunsetHourAngleRad: g.sunsetHourAngleRad,
    raMJm2,
    daylightHours: nHours,
    rsMJm2,
    rsoMJm2,
    rnsMJm2,
    rnlMJm2,
    rnMJm2,
    gMJm2,
    u2Ms,
  };
  const eto = penmanMonteithEtoMm(terms);
  const estimated: EstimatedInput[] = [];
  if (solar.estimated) estimated.push("solar");
  if (humidity.estimated) estimated.push("humidity");
  if (wind.estimated) estimated.push("wind");
  return {
    method: "penman-monteith",
    etoMm: Math.max(0, eto),
    etoRawMm: eto,
    estimated,
    sources: { solar: solar.source, humidity: humidity.source, wind: wind.source },
    terms,
  };
}

/** Wind at 2 m for a reading at `heightM` (re-exported convenience; FAO-56 eq. 47). */
export const windSpeedAt2mMs = windAt2mMs;
