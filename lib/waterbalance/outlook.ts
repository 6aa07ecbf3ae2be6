import type {
  FieldSpec,
  KcUsed,
  PlantingSpec,
  RainDayInput,
  SystemSpec,
  WeatherDayInput,
} from "./account-types";
import { computeFieldSeason } from "./balance";
import { addDaysIso, dayNumberToIsoDate, isoDateToDayNumber } from "./dates";
import { requireNonNegative, requirePositive, requireRange, WaterBalanceInputError } from "./errors";

/** The account projected forward, and what to apply and when. */

/** How the system delivers water, for run time. */
export type ApplicationRate =
  { kind: "flow"; flowRateM3H: number } | { kind: "pivot"; depthPerPassMm: number; hoursPerPass: number };

/** Inputs of {@link computeOutlook}. */
export interface OutlookInput {
  field: FieldSpec;
  planting: PlantingSpec;
  system: SystemSpec;
  /** first day projected (the day after the last account day) */
  fromDate: string;
  /** depletion at the start of `fromDate`, mm (the account's last depletionEndMm) */
  startDepletionMm: number;
  /** number of days to project */
  days: number;
  /** forecast ETo by day from `fromDate`, mm; days beyond it use the recent mean */
  forecastEtoMm?: readonly number[];
  /** the account's recent daily ETo, mm (default for days without forecast) */
  recentEtoMm?: readonly number[];
  /** forecast rain by day from `fromDate`, mm */
  forecastRainMm?: readonly number[];
  /** fraction of forecast rain not counted (0-1, default 0: count it all, after runoff) */
  forecastRainDiscount?: number;
  /** depth left unfilled for rain, mm (default 0: refill to field capacity) */
  reserveMm?: number;
  /** override the planting's trigger: a MAD fraction of TAW, or 'raw' */
  trigger?: { mad: number } | "raw";
  /**
   * the Kc the account used (FieldAccountResult.kcUsed, or the columns' crop.kcUsed), so a
   * climate-adjusted Kc carries into the outlook, which has no weather of its own to adjust from
   */
  kcUsed?: Pick<KcUsed, "ini" | "mid" | "end">;
  application?: ApplicationRate;
}

/** One projected day. */
export interface OutlookDay {
  date: string;
  etoMm: number;
  etoSource: "forecast" | "recent-mean";
  kc: number;
  etcAdjMm: number;
  rainCountedMm: number;
  effectiveRainMm: number;
  depletionStartMm: number;
  depletionEndMm: number;
  tawMm: number;
  triggerMm: number;
  ks: number;
}

/** The outlook and the recommendation. */
export interface OutlookResult {
  days: OutlookDay[];
  /** first day whose end depletion reaches the trigger, or null within the horizon */
  triggerDate: string | null;
  /** the field is at or past its trigger at the start of `fromDate` */
  dueNow: boolean;
  daysUntilTrigger: number | null;
  /** net depth to apply on the trigger day: refill to field capacity less the reserve, mm */
  netDepthMm: number | null;
  /** net ÷ application efficiency, mm */
  grossDepthMm: number | null;
  /** gross volume over the field, m³ */
  grossVolumeM3: number | null;
  /** hours to apply the gross depth (flow rate, or passes × hours per pass for a pivot) */
  runTimeH: number | null;
  /** pivot passes (fractional) needed for the gross depth */
  pivotPasses: number | null;
  /** mean ETo used for days without forecast, mm/d */
  meanEtoMm: number;
}

/**
 * Projects the account `days` days ahead with forecast ETo (or the recent mean) and optional
 * discounted forecast rain (curve-number runoff as in the account), and recommends the irrigation:
 * the first day depletion reaches the trigger (MAD × TAW, else RAW = p TAW, FAO-56 eq. 83), the net
 * depth to refill (to field capacity, less a reserve for rain), the gross depth (net ÷ application
 * efficiency), the volume (1 mm on 1 ha = 10 m³) and the run time.
 */
export function computeOutlook(input: OutlookInput): OutlookResult {
  const n = Math.floor(requireRange("days", input.days, 1, 366));
  requireNonNegative("startDepletionMm", input.startDepletionMm);
  const discount = requireRange("forecastRainDiscount", input.forecastRainDiscount ?? 0, 0, 1);
  const reserve = requireNonNegative("reserveMm", input.reserveMm ?? 0);
  const recent = (input.recentEtoMm ?? []).filter((x) => Number.isFinite(x) && x >= 0);
  const forecast = input.forecastEtoMm ?? [];
  if (recent.length === 0 && forecast.length === 0) {
    throw new WaterBalanceInputError("recentEtoMm", "give forecast ETo or the recent ETo of the account");
  }
  const meanSource = recent.length ? recent : forecast.slice(0, 7);
  const meanEto = meanSource.reduce((a, b) => a + b, 0) / meanSource.length;
  const fromDay = isoDateToDayNumber(input.fromDate, "fromDate");
  const weather: WeatherDayInput[] = [];
  const rain: RainDayInput[] = [];
  const etoSource: ("forecast" | "recent-mean")[] = [];
  const counted: number[] = [];
  for (let d = 0; d < n; d++) {
    const date = dayNumberToIsoDate(fromDay + d);
    const f = forecast[d];
    const eto = f !== undefined && Number.isFinite(f) ? requireNonNegative("forecastEtoMm", f) : meanEto;
    etoSource.push(f !== undefined && Number.isFinite(f) ? "forecast" : "recent-mean");
    weather.push({ date, etoMm: eto });
    const r = input.forecastRainMm?.[d];
    const c = r !== undefined ? requireNonNegative("forecastRainMm", r) * (1 - discount) : 0;
    counted.push(c);
    if (c > 0) rain.push({ date, kind: "total", rainMm: c, source: { kind: "other", note: "forecast" } });
  }
  const planting: PlantingSpec = Object.assign({}, input.planting);
  if (input.trigger !== undefined)
    planting.triggerMad = input.trigger === "raw" ? undefined : input.trigger.mad;
  if (input.kcUsed) {
    planting.kc = { ini: input.kcUsed.ini, mid: input.kcUsed.mid, end: input.kcUsed.end };
    planting.climateAdjust = false;
  }
  const cols = computeFieldSeason({
    field: input.field,
    planting,
    system: input.system,
    weather,
    rain,
    startDate: input.fromDate,
    endDate: addDaysIso(input.fromDate, n - 1),
    initialDepletionMm: input.startDepletionMm,
  });
  const { crop, loop } = cols;
  const days: OutlookDay[] = [];
  let triggerIdx = -1;
  let dueNow = false;
  for (let d = 0; d < n; d++) {
    const taw = crop.tawMm[d]!;
    const triggerMm = cols.triggerMad !== null ? cols.triggerMad * taw : loop.rawMm[d]!;
    if (d === 0 && loop.depletionStartMm[0]! >= triggerMm) dueNow = true;
    if (triggerIdx < 0 && loop.depletionEndMm[d]! >= triggerMm) triggerIdx = d;
    days.push({
      date: dayNumberToIsoDate(fromDay + d),
      etoMm: crop.etoMm[d]!,
      etoSource: etoSource[d]!,
      kc: crop.kc[d]! + loop.ke[d]!,
      etcAdjMm: loop.etcAdjMm[d]!,
      rainCountedMm: counted[d]!,
      effectiveRainMm: loop.effectiveRainMm[d]!,
      depletionStartMm: loop.depletionStartMm[d]!,
      depletionEndMm: loop.depletionEndMm[d]!,
      tawMm: taw,
      triggerMm,
      ks: loop.ks[d]!,
    });
  }
  const base: OutlookResult = {
    days,
    triggerDate: null,
    dueNow,
    daysUntilTrigger: null,
    netDepthMm: null,
    grossDepthMm: null,
    grossVolumeM3: null,
    runTimeH: null,
    pivotPasses: null,
    meanEtoMm: meanEto,
  };
  if (triggerIdx < 0) return base;
  const net = Math.max(0, loop.depletionEndMm[triggerIdx]! - reserve);
  const rec = irrigationDepths(
    net,
    input.system.applicationEfficiency,
    input.field.areaHa,
    input.application,
  );
  return { ...base, triggerDate: days[triggerIdx]!.date, daysUntilTrigger: triggerIdx, ...rec };
}

/**
 * Gross depth, volume and run time for a net depth: gross = net / efficiency; volume = gross × area × 10
 * (m³); run time = volume / flow rate, or for a pivot, passes = gross / depth per pass and
 * run time = passes × hours per pass.
 */
export function irrigationDepths(
  netDepthMm: number,
  applicationEfficiency: number,
  areaHa: number,
  application?: ApplicationRate,
): {
  netDepthMm: number;
  grossDepthMm: number;
  grossVolumeM3: number;
  runTimeH: number | null;
  pivotPasses: number | null;
} {
  requireNonNegative("netDepthMm", netDepthMm);
  requireRange("applicationEfficiency", applicationEfficiency, 0.01, 1);
  requirePositive("areaHa", areaHa);
  const gross = netDepthMm / applicationEfficiency;
  const volume = gross * areaHa * 10;
  let runTimeH: number | null = null;
  let pivotPasses: number | null = null;
  if (application?.kind === "flow") {
    runTimeH = volume / requirePositive("flowRateM3H", application.flowRateM3H);
  } else if (application?.kind === "pivot") {
    pivotPasses = gross / requirePositive("depthPerPassMm", application.depthPerPassMm);
    runTimeH = pivotPasses * requirePositive("hoursPerPass", application.hoursPerPass);
  }
  return { netDepthMm, grossDepthMm: gross, grossVolumeM3: volume, runTimeH, pivotPasses };
}
