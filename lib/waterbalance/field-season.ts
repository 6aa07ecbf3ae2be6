import type { FieldAccountInput, KcUsed, EtoProvenance, WeatherDayInput } from "./account-types";
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
import { isoDateToDayNumber, dayNumberToIsoDate } from "./dates";
import { canopyCoverFraction, kcMax } from "./dual-coefficient";
import { requireFinite, requireNonNegative, requirePositive, requireRange, WaterBalanceInputError } from "./errors";
import { windAt2mMs } from "./meteo";
import { referenceEtDaily, type DailyWeather } from "./reference-et";
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
const FILLED: EtoProvenance = Object.freeze({ method: "filled-mean", estimated: Object.freeze(["eto"] as const) });
const provenanceCache = new Map<string, EtoProvenance>();

function etoProvenance(method: "penman-monteith" | "hargreaves", estimated: readonly string[]): EtoProvenance {
  const key = `${method}|${estimated.join(",")}`;
  let p = provenanceCache.get(key);
  if (!p) {
    p = Object.freeze({ method, estimated: Object.freeze([...estimated]) as EtoProvenance["estimated"] });
    provenanceCache.set(key, p);
  }
  return p;
}

/** Checks the parts of the input that do not depend on any one day. */
export function validateAccountInput(input: FieldAccountInput): { startDay: number; n: number } {
  const startDay = isoDateToDayNumber(input.startDate, "startDate");
  const endDay = isoDateToDayNumber(input.endDate, "endDate");
  if (endDay < startDay) throw new WaterBalanceInputError("endDate", "is before startDate");
  const n = endDay - startDay + 1;
  if (n > MAX_ACCOUNT_DAYS) throw new WaterBalanceInputError("endDate", `the span is longer than ${MAX_ACCOUNT_DAYS} days`);
  requireNonNegative("initialDepletionMm", input.initialDepletionMm);
  requirePositive("field.areaHa", input.field.areaHa);
  requireRange("system.applicationEfficiency", input.system.applicationEfficiency, 0.01, 1);
  if (input.system.wettedFraction !== undefined) requireRange("system.wettedFraction", input.system.wettedFraction, 0.01, 1);
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
  plantingDay: number,
  fromDayOfSeason: number,
  toDayOfSeason: number,
  windHeightM: number,
): { windMs: number | null; rhMinPct: number | null } {
  let sw = 0;
  let nw = 0;
  let sr = 0;
  let nr = 0;
  for (const w of weather) {
    if (isGiven(w)) continue;
    const i = isoDateToDayNumber(w.date, "weather.date") - plantingDay + 1;
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

function kcUsedFor(input: FieldAccountInput): KcUsed {
  const pl = input.planting;
  const adj = pl.climateAdjust;
  const base: KcUsed = { ...pl.kc, adjusted: false, midWindMs: null, midRhMinPct: null, endWindMs: null, endRhMinPct: null };
  if (!adj) return base;
  const explicit = typeof adj === "object" ? adj : {};
  const plantingDay = isoDateToDayNumber(pl.plantingDate);
  const s = pl.stages;
  const midFrom = s.iniDays + s.devDays + 1;
  const midTo = midFrom + s.midDays - 1;
  const windH = input.station?.windHeightM ?? 2;
  const mid = climateMeans(input.weather, plantingDay, midFrom, midTo, windH);
  const late = climateMeans(input.weather, plantingDay, midTo + 1, midTo + s.lateDays, windH);
  const h = pl.heightM ?? 1;
  const midWind = explicit.midWindMs ?? mid.windMs;
  const midRh = explicit.midRhMinPct ?? mid.rhMinPct;
  const endWind = explicit.endWindMs ?? late.windMs ?? midWind;
  const endRh = explicit.endRhMinPct ?? late.rhMinPct ?? midRh;
  const out: KcUsed = { ...base, midWindMs: midWind, midRhMinPct: midRh, endWindMs: endWind, endRhMinPct: endRh };
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

/**
 * ETo by day for the account span: given values, FAO-56 daily Penman-Monteith (or Hargreaves) from raw
 * weather, and the mean of the previous `fillDays` days for a day without weather (flagged 'filled-mean').
 */
export function etoForSpan(
  input: Pick<FieldAccountInput, "weather" | "station" | "options">,
  startDay: number,
  n: number,
): { etoMm: Float64Array; provenance: EtoProvenance[] } {
  const eto = new Float64Array(n).fill(NaN);
  const prov: EtoProvenance[] = new Array<EtoProvenance>(n).fill(FILLED);
  const temperatureOnly = input.options?.temperatureOnly;
  for (const w of input.weather) {
    const d = isoDateToDayNumber(w.date, "weather.date") - startDay;
    if (d < 0 || d >= n) continue;
    if (isGiven(w)) {
      eto[d] = requireNonNegative("weather.etoMm", requireFinite("weather.etoMm", w.etoMm));
      prov[d] = GIVEN;
      continue;
    }
    if (!input.station) throw new WaterBalanceInputError("station", "is required when weather days are raw readings");
    const r = referenceEtDaily(w as DailyWeather, input.station, { temperatureOnly });
    eto[d] = r.etoMm;
    prov[d] = etoProvenance(r.method, r.estimated);
  }
  const fillDays = Math.max(1, Math.floor(input.options?.etoFillDays ?? 7));
  let firstKnown = -1;
  for (let d = 0; d < n; d++) if (eto[d] === eto[d]) { firstKnown = d; break; }
  if (firstKnown < 0) throw new WaterBalanceInputError("weather", `no weather for any day from ${dayNumberToIsoDate(startDay)}`);
  // before the first known day, borrow the mean of the first known days
  const recent: number[] = [];
  for (let d = firstKnown; d < n && recent.length < fillDays; d++) if (eto[d] === eto[d]) recent.push(eto[d]!);
  for (let d = 0; d < n; d++) {
    const v = eto[d]!;
    if (v === v) {
      if (d >= firstKnown) {
        recent.push(v);
        if (recent.length > fillDays) recent.shift();
      }
      continue;
    }
    let s = 0;
    for (const x of recent) s += x;
    eto[d] = s / recent.length;
  }
  return { etoMm: eto, provenance: prov };
}

/** Builds the crop and soil arrays of a season (FAO-56 eq. 62, 65, 66, 72, 76, 82). */
export function prepareCropSeason(input: FieldAccountInput): PreparedCropSeason {
  const { startDay, n } = validateAccountInput(input);
  const soil = resolveSoil(input.field.soil);
  const pl = input.planting;
  const plantingDay = isoDateToDayNumber(pl.plantingDate);
  const { etoMm, provenance } = etoForSpan(input, startDay, n);
  const kcUsed = kcUsedFor(input);
  const curve = { ini: kcUsed.ini, mid: kcUsed.mid, end: kcUsed.end };
  const fallow = pl.fallowKc ?? curve.ini;
  const kc = new Float64Array(n);
  const stage: CropStage[] = new Array<CropStage>(n);
  const rootDepthM = new Float64Array(n);
  const tawMm = new Float64Array(n);
  const pTable = new Float64Array(n).fill(pl.pTable);
  const dw = soil.thetaFc - soil.thetaWp;
  let dual: LoopDual | null = null;
  const dualSpec = pl.dual;
  const kcMaxArr = dualSpec ? new Float64Array(n) : null;
  const cover = dualSpec ? new Float64Array(n) : null;
  const weatherByDay = dualSpec ? rawWeatherByDay(input.weather, startDay, n) : null;
  const hMax = pl.heightM ?? 1;
  for (let d = 0; d < n; d++) {
    const i = startDay + d - plantingDay + 1;
    stage[d] = cropStageForDay(i, pl.stages);
    rootDepthM[d] = rootDepthForDayM(i, pl.rootDepthMinM, pl.rootDepthMaxM, pl.stages);
    tawMm[d] = 1000 * dw * rootDepthM[d]!;
    if (dualSpec && kcMaxArr && cover && weatherByDay) {
      const kcb = kcForDay(i, dualSpec.kcb, pl.stages, dualSpec.kcMin ?? 0.15);
      kc[d] = kcb;
      const growth = dualSpec.kcb.mid > dualSpec.kcb.ini ? (kcb - dualSpec.kcb.ini) / (dualSpec.kcb.mid - dualSpec.kcb.ini) : 1;
      const h = Math.max(0.05, hMax * Math.min(1, Math.max(0, growth)));
      const w = weatherByDay[d];
      const u2 = w?.windMs !== undefined ? windAt2mMs(w.windMs, w.windHeightM ?? input.station?.windHeightM ?? 2) : (kcUsed.midWindMs ?? 2);
      const rh = w?.rhMinPct ?? kcUsed.midRhMinPct ?? 45;
      const km = kcMax(u2, rh, h, kcb);
      kcMaxArr[d] = km;
      cover[d] = stage[d] === "before" || stage[d] === "after" ? 0 : canopyCoverFraction(kcb, dualSpec.kcMin ?? 0.15, km, h);
    } else {
      kc[d] = kcForDay(i, curve, pl.stages, fallow);
    }
  }
  if (dualSpec && kcMaxArr && cover) {
    const tew = dualSpec.tewMm ?? (dualSpec.zeM !== undefined ? 1000 * (soil.thetaFc - 0.5 * soil.thetaWp) * dualSpec.zeM : soil.tewMm);
    const rew = Math.min(dualSpec.rewMm ?? soil.rewMm, tew);
    dual = {
      kcMax: kcMaxArr,
      coverFraction: cover,
      tewMm: tew,
      rewMm: rew,
      wettedFractionIrrigation: input.system.wettedFraction ?? 1,
      initialDeMm: Math.min(tew, input.initialDepletionMm > 0 ? rew : 0),
    };
  }
  return { n, startDay, soil, etoMm, etoProvenance: provenance, kc, stage, rootDepthM, tawMm, pTable, dual, kcUsed };
}

function rawWeatherByDay(weather: readonly WeatherDayInput[], startDay: number, n: number): (DailyWeather | undefined)[] {
  const out = new Array<DailyWeather | undefined>(n);
  for (const w of weather) {
    if (isGiven(w)) continue;
    const d = isoDateToDayNumber(w.date, "weather.date") - startDay;
    if (d >= 0 && d < n) out[d] = w;
  }
  return out;
}
