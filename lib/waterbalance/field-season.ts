import type { FieldAccountInput, KcUsed, EtoProvenance, WeatherDayInput } from "./account-types";
import { float64Columns } from "./arrays";
import type { LoopDual } from "./balance-loop";
import {
  adjustKcEndForClimate,
  adjustKcMidForClimate,
  cropStageForDay,
  kcForDay,
  rootDepthForDayM,
  validateCurve,
  validateStages,
  type CropStage,
} from "./crop-coefficient";
import { dayNumberToIsoDate, dayOfYearOfDayNumber, isoDateToDayNumber } from "./dates";
import { canopyCoverFraction, kcMax } from "./dual-coefficient";
import {
  requireFinite,
  requireNonNegative,
  requirePositive,
  requireRange,
  WaterBalanceInputError,
} from "./errors";
import { windAt2mMs } from "./meteo";
import {
  computeDailyEtoInto,
  emptyEtoScratch,
  estimatedFromMask,
  siteConstants,
  validateDailyWeather,
  type DailyWeather,
  type SiteConstants,
} from "./reference-et";
import { resolveSoil, type ResolvedSoil } from "./soils";

/** Season arrays for one field: ETo, Kc, root depth, TAW and p by day, ready for the balance loop. */

/** Longest span the engine accepts in one call, days (ten years and a bit). */
export const MAX_ACCOUNT_DAYS = 3700;

/** The crop and soil side of a prepared season. */
export interface PreparedCropSeason {
  n: number;
  startDay: number;
  soil: ResolvedSoil;
  etoMm: Float64Array;
  etoProvenance: EtoProvenance[];
  /** Kc (single) or Kcb (dual) */
  kc: Float64Array;
  stage: CropStage[];
  rootDepthM: Float64Array;
  tawMm: Float64Array;
  pTable: Float64Array;
  dual: LoopDual | null;
  kcUsed: KcUsed;
}

function isGiven(w: WeatherDayInput): w is { date: string; etoMm: number } {
  return (w as { etoMm?: unknown }).etoMm !== undefined;
}

const GIVEN: EtoProvenance = Object.freeze({ method: "given", estimated: Object.freeze([]) as readonly [] });
const FILLED: EtoProvenance = Object.freeze({
  method: "filled-mean",
  estimated: Object.freeze(["eto"] as const),
});
const PM_BY_MASK: readonly EtoProvenance[] = [0, 1, 2, 3, 4, 5, 6, 7].map((m) =>
  Object.freeze({ method: "penman-monteith" as const, estimated: Object.freeze(estimatedFromMask(m)) }),
);
const HARGREAVES: EtoProvenance = Object.freeze({
  method: "hargreaves",
  estimated: Object.freeze(estimatedFromMask(7)),
});

/** Checks the parts of the input that do not depend on any one day. */
export function validateAccountInput(input: FieldAccountInput): { startDay: number; n: number } {
  const startDay = isoDateToDayNumber(input.startDate, "startDate");
  const endDay = isoDateToDayNumber(input.endDate, "endDate");
  if (endDay < startDay) throw new WaterBalanceInputError("endDate", "is before startDate");
  const n = endDay - startDay + 1;
  if (n > MAX_ACCOUNT_DAYS)
    throw new WaterBalanceInputError("endDate", `the span is longer than ${MAX_ACCOUNT_DAYS} days`);
  requireNonNegative("initialDepletionMm", input.initialDepletionMm);
  requirePositive("field.areaHa", input.field.areaHa);
  requireRange("system.applicationEfficiency", input.system.applicationEfficiency, 0.01, 1);
  if (input.system.wettedFraction !== undefined)
    requireRange("system.wettedFraction", input.system.wettedFraction, 0.01, 1);
  const pl = input.planting;
  isoDateToDayNumber(pl.plantingDate, "planting.plantingDate");
  validateCurve("planting.kc", pl.kc);
  validateStages(pl.stages);
  requireRange("planting.rootDepthMinM", pl.rootDepthMinM, 0.01, 5);
  requireRange("planting.rootDepthMaxM", pl.rootDepthMaxM, pl.rootDepthMinM, 5);
  requireRange("planting.pTable", pl.pTable, 0, 1);
  if (pl.triggerMad !== undefined) requireRange("planting.triggerMad", pl.triggerMad, 0.01, 1);
  if (pl.heightM !== undefined) requireRange("planting.heightM", pl.heightM, 0, 10);
  if (pl.fallowKc !== undefined) requireRange("planting.fallowKc", pl.fallowKc, 0, 2);
  if (pl.dual) validateCurve("planting.dual.kcb", pl.dual.kcb);
  return { startDay, n };
}

function climateMeans(
  weather: readonly WeatherDayInput[],
  weatherDays: Int32Array,
  plantingDay: number,
  fromDayOfSeason: number,
  toDayOfSeason: number,
  windHeightM: number,
): { windMs: number | null; rhMinPct: number | null } {
  let sw = 0;
  let nw = 0;
  let sr = 0;
  let nr = 0;
  for (let k = 0; k < weather.length; k++) {
    const w = weather[k]!;
    if (isGiven(w)) continue;
    const i = weatherDays[k]! - plantingDay + 1;
    if (i < fromDayOfSeason || i > toDayOfSeason) continue;
    if (w.windMs !== undefined) {
      const h = w.windHeightM ?? windHeightM;
      sw += h === 2 ? w.windMs : windAt2mMs(w.windMs, h);
      nw++;
    }
    if (w.rhMinPct !== undefined) {
      sr += w.rhMinPct;
      nr++;
    }
  }
  return { windMs: nw ? sw / nw : null, rhMinPct: nr ? sr / nr : null };
}

function kcUsedFor(input: FieldAccountInput, weatherDays: Int32Array): KcUsed {
  const pl = input.planting;
  const adj = pl.climateAdjust;
  const base: KcUsed = {
    ini: pl.kc.ini,
    mid: pl.kc.mid,
    end: pl.kc.end,
    adjusted: false,
    midWindMs: null,
    midRhMinPct: null,
    endWindMs: null,
    endRhMinPct: null,
  };
  if (!adj) return base;
  const explicit = typeof adj === "object" ? adj : {};
  const plantingDay = isoDateToDayNumber(pl.plantingDate);
  const s = pl.stages;
  const midFrom = s.iniDays + s.devDays + 1;
  const midTo = midFrom + s.midDays - 1;
  const windH = input.station?.windHeightM ?? 2;
  const mid = climateMeans(input.weather, weatherDays, plantingDay, midFrom, midTo, windH);
  const late = climateMeans(input.weather, weatherDays, plantingDay, midTo + 1, midTo + s.lateDays, windH);
  const h = pl.heightM ?? 1;
  const midWind = explicit.midWindMs ?? mid.windMs;
  const midRh = explicit.midRhMinPct ?? mid.rhMinPct;
  const endWind = explicit.endWindMs ?? late.windMs ?? midWind;
  const endRh = explicit.endRhMinPct ?? late.rhMinPct ?? midRh;
  const out: KcUsed = {
    ini: base.ini,
    mid: base.mid,
    end: base.end,
    adjusted: false,
    midWindMs: midWind,
    midRhMinPct: midRh,
    endWindMs: endWind,
    endRhMinPct: endRh,
  };
  if (midWind !== null && midRh !== null) {
    out.mid = adjustKcMidForClimate(pl.kc.mid, midWind, midRh, h);
    out.adjusted = true;
  }
  if (endWind !== null && endRh !== null) {
    out.end = adjustKcEndForClimate(pl.kc.end, endWind, endRh, h);
    out.adjusted = true;
  }
  return out;
}

/** Day numbers of the weather days' dates, parsed once. */
export function weatherDayNumbers(weather: readonly WeatherDayInput[]): Int32Array {
  const out = new Int32Array(weather.length);
  for (let k = 0; k < weather.length; k++) out[k] = isoDateToDayNumber(weather[k]!.date, "weather.date");
  return out;
}

/**
 * ETo by day for the account span: given values, FAO-56 daily Penman-Monteith (or Hargreaves) from raw
 * weather, and the mean of the previous `fillDays` days for a day without weather (flagged 'filled-mean').
 */
export function etoForSpan(
  input: Pick<FieldAccountInput, "weather" | "station" | "options">,
  startDay: number,
  n: number,
  weatherDays: Int32Array = weatherDayNumbers(input.weather),
): { etoMm: Float64Array; provenance: EtoProvenance[] } {
  const eto = new Float64Array(n).fill(NaN);
  const prov: EtoProvenance[] = new Array<EtoProvenance>(n).fill(FILLED);
  const options = { temperatureOnly: input.options?.temperatureOnly };
  const scratch = emptyEtoScratch();
  let consts: SiteConstants | null = null;
  for (let k = 0; k < input.weather.length; k++) {
    const w = input.weather[k]!;
    const d = weatherDays[k]! - startDay;
    if (d < 0 || d >= n) continue;
    if (isGiven(w)) {
      eto[d] = requireNonNegative("weather.etoMm", requireFinite("weather.etoMm", w.etoMm));
      prov[d] = GIVEN;
      continue;
    }
    const site = input.station;
    if (!site) throw new WaterBalanceInputError("station", "is required when weather days are raw readings");
    if (consts === null) consts = siteConstants(site);
    validateDailyWeather(w);
    computeDailyEtoInto(w, site, consts, dayOfYearOfDayNumber(weatherDays[k]!), options, scratch);
    eto[d] = scratch.etoRawMm > 0 ? scratch.etoRawMm : 0;
    prov[d] = scratch.method === "hargreaves" ? HARGREAVES : PM_BY_MASK[scratch.estimatedMask]!;
  }
  const fillDays = Math.max(1, Math.floor(input.options?.etoFillDays ?? 7));
  let firstKnown = -1;
  for (let d = 0; d < n; d++) {
    if (eto[d] === eto[d]) {
      firstKnown = d;
      break;
    }
  }
  if (firstKnown < 0)
    throw new WaterBalanceInputError(
      "weather",
      `no weather for any day from ${dayNumberToIsoDate(startDay)}`,
    );
  // before the first known day, borrow the mean of the first known days
  let leadSum = 0;
  let leadN = 0;
  for (let d = firstKnown; d < n && leadN < fillDays; d++) {
    if (eto[d] === eto[d]) {
      leadSum += eto[d]!;
      leadN++;
    }
  }
  const window: number[] = [];
  let sum = 0;
  for (let d = 0; d < n; d++) {
    const v = eto[d]!;
    if (v === v) {
      window.push(v);
      sum += v;
      if (window.length > fillDays) sum -= window.shift()!;
    } else {
      eto[d] = window.length ? sum / window.length : leadSum / leadN;
    }
  }
  return { etoMm: eto, provenance: prov };
}

/** A station's ETo over a span, computed once and shared by every field the station serves. */
export interface StationEtoSeries {
  /** first date of the series */
  startDate: string;
  etoMm: Float64Array;
  provenance: EtoProvenance[];
  /** the weather array the series was computed from, and its dates as day numbers (reused by fields that pass the same array) */
  weather?: readonly WeatherDayInput[];
  weatherDays?: Int32Array;
}

/**
 * ETo for a station from `startDate` to `endDate` (FAO-56 eq. 6 with the chapter 3 missing-data
 * rules, or eq. 52; gaps filled with the recent mean and flagged). Pass the result as `eto` to each
 * field on the station so a whole-farm recompute computes each station-day once.
 */
export function computeStationEto(
  weather: readonly WeatherDayInput[],
  station: FieldAccountInput["station"],
  startDate: string,
  endDate: string,
  options: FieldAccountInput["options"] = {},
): StationEtoSeries {
  const startDay = isoDateToDayNumber(startDate, "startDate");
  const n = isoDateToDayNumber(endDate, "endDate") - startDay + 1;
  if (n < 1) throw new WaterBalanceInputError("endDate", "is before startDate");
  if (n > MAX_ACCOUNT_DAYS)
    throw new WaterBalanceInputError("endDate", `the span is longer than ${MAX_ACCOUNT_DAYS} days`);
  const weatherDays = weatherDayNumbers(weather);
  const { etoMm, provenance } = etoForSpan({ weather, station, options }, startDay, n, weatherDays);
  return { startDate, etoMm, provenance, weather, weatherDays };
}

function etoFromSeries(
  series: StationEtoSeries,
  startDay: number,
  n: number,
): { etoMm: Float64Array; provenance: EtoProvenance[] } {
  const offset = startDay - isoDateToDayNumber(series.startDate, "eto.startDate");
  if (offset < 0 || offset + n > series.etoMm.length || series.provenance.length !== series.etoMm.length) {
    throw new WaterBalanceInputError("eto", "the ETo series does not cover the account's span");
  }
  return {
    etoMm: series.etoMm.subarray(offset, offset + n),
    provenance: series.provenance.slice(offset, offset + n),
  };
}

/** Builds the crop and soil arrays of a season (FAO-56 eq. 62, 65, 66, 72, 76, 82). */
export function prepareCropSeason(input: FieldAccountInput): PreparedCropSeason {
  const { startDay, n } = validateAccountInput(input);
  const soil = resolveSoil(input.field.soil);
  const pl = input.planting;
  const plantingDay = isoDateToDayNumber(pl.plantingDate);
  let parsed: Int32Array | null = null;
  const shared =
    input.eto?.weather === input.weather && input.eto.weatherDays?.length === input.weather.length
      ? input.eto.weatherDays
      : undefined;
  const weatherDays = (): Int32Array => (parsed ??= shared ?? weatherDayNumbers(input.weather));
  const { etoMm, provenance } = input.eto
    ? etoFromSeries(input.eto, startDay, n)
    : etoForSpan(input, startDay, n, weatherDays());
  const kcUsed = pl.climateAdjust ? kcUsedFor(input, weatherDays()) : kcUsedFor(input, new Int32Array(0));
  const curve = { ini: kcUsed.ini, mid: kcUsed.mid, end: kcUsed.end };
  const fallow = pl.fallowKc ?? curve.ini;
  const cols = float64Columns(n, 4);
  const kc = cols[0]!;
  const rootDepthM = cols[1]!;
  const tawMm = cols[2]!;
  const pTable = cols[3]!.fill(pl.pTable);
  const stage: CropStage[] = new Array<CropStage>(n);
  const dw = soil.thetaFc - soil.thetaWp;
  let dual: LoopDual | null = null;
  const dualSpec = pl.dual;
  const kcMaxArr = dualSpec ? new Float64Array(n) : null;
  const cover = dualSpec ? new Float64Array(n) : null;
  const weatherByDay = dualSpec ? rawWeatherByDay(input.weather, weatherDays(), startDay, n) : null;
  const hMax = pl.heightM ?? 1;
  for (let d = 0; d < n; d++) {
    const i = startDay + d - plantingDay + 1;
    stage[d] = cropStageForDay(i, pl.stages);
    rootDepthM[d] = rootDepthForDayM(i, pl.rootDepthMinM, pl.rootDepthMaxM, pl.stages);
    tawMm[d] = 1000 * dw * rootDepthM[d]!;
    if (dualSpec && kcMaxArr && cover && weatherByDay) {
      const kcb = kcForDay(i, dualSpec.kcb, pl.stages, dualSpec.kcMin ?? 0.15);
      kc[d] = kcb;
      const growth =
        dualSpec.kcb.mid > dualSpec.kcb.ini
          ? (kcb - dualSpec.kcb.ini) / (dualSpec.kcb.mid - dualSpec.kcb.ini)
          : 1;
      const h = Math.max(0.05, hMax * Math.min(1, Math.max(0, growth)));
      const w = weatherByDay[d];
      const u2 =
        w?.windMs !== undefined
          ? windAt2mMs(w.windMs, w.windHeightM ?? input.station?.windHeightM ?? 2)
          : (kcUsed.midWindMs ?? 2);
      const rh = w?.rhMinPct ?? kcUsed.midRhMinPct ?? 45;
      const km = kcMax(u2, rh, h, kcb);
      kcMaxArr[d] = km;
      cover[d] =
        stage[d] === "before" || stage[d] === "after"
          ? 0
          : canopyCoverFraction(kcb, dualSpec.kcMin ?? 0.15, km, h);
    } else {
      kc[d] = kcForDay(i, curve, pl.stages, fallow);
    }
  }
  if (dualSpec && kcMaxArr && cover) {
    const tew =
      dualSpec.tewMm ??
      (dualSpec.zeM !== undefined ? 1000 * (soil.thetaFc - 0.5 * soil.thetaWp) * dualSpec.zeM : soil.tewMm);
    const rew = Math.min(dualSpec.rewMm ?? soil.rewMm, tew);
    dual = {
      kcMax: kcMaxArr,
      coverFraction: cover,
      tewMm: tew,
      rewMm: rew,
      wettedFractionIrrigation: input.system.wettedFraction ?? 1,
      // a root zone that starts short of field capacity is taken to have a surface layer at the end of
      // stage 1 (De = REW); a full one starts wet (common practice, no source)
      initialDeMm: Math.min(tew, input.initialDepletionMm > 0 ? rew : 0),
    };
  }
  return {
    n,
    startDay,
    soil,
    etoMm,
    etoProvenance: provenance,
    kc,
    stage,
    rootDepthM,
    tawMm,
    pTable,
    dual,
    kcUsed,
  };
}

function rawWeatherByDay(
  weather: readonly WeatherDayInput[],
  weatherDays: Int32Array,
  startDay: number,
  n: number,
): (DailyWeather | undefined)[] {
  const out = new Array<DailyWeather | undefined>(n);
  for (let k = 0; k < weather.length; k++) {
    const w = weather[k]!;
    if (isGiven(w)) continue;
    const d = weatherDays[k]! - startDay;
    if (d >= 0 && d < n) out[d] = w;
  }
  return out;
}
