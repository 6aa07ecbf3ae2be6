import type {
  AntecedentCondition,
  AntecedentFormula,
  AntecedentThresholds,
  HydrologicSoilGroup,
  RunoffCover,
} from "./runoff";
import type { CoefficientCurve, CropStage, StageLengths } from "./crop-coefficient";
import type { DailyWeather, EstimatedInput, StationSite } from "./reference-et";
import type { GaugeWeight } from "./gauge-weights";
import type { KineticEnergyMethod, SealingOptions } from "./rain-energy";
import type { SoilSpec } from "./soils";
import type { StationEtoSeries } from "./field-season";
import type { HyetographOptions, RainRecord } from "./storms";

/** Shapes of {@link runFieldAccount}'s input and output: what the data layer passes and stores. */

/** How rain runs off a field on days with only a daily total. */
export interface RunoffSpec {
  /** average-condition (II) curve number; else looked up from group and cover */
  curveNumber?: number;
  hydrologicSoilGroup?: HydrologicSoilGroup;
  cover?: RunoffCover;
  /** initial abstraction ratio (default 0.2) */
  iaRatio?: 0.2 | 0.05;
  /** 'account' (default): dry / average / wet from the day's start depletion; or a fixed condition */
  antecedent?: "account" | AntecedentCondition;
  antecedentFormula?: AntecedentFormula;
  antecedentThresholds?: AntecedentThresholds;
  /** adjust the curve number for the field's slope (Williams 1995); default false */
  slopeAdjust?: boolean;
  /** 'none' turns runoff off: all rain counts (default 'curve-number') */
  dailyMethod?: "curve-number" | "none";
}

/** The field: its soil, area and surface. */
export interface FieldSpec {
  soil: SoilSpec;
  areaHa: number;
  runoff?: RunoffSpec;
  slopePct?: number;
}

/** Dual crop coefficient settings (FAO-56 chapter 7), the advanced option. */
export interface DualSpec {
  /** basal coefficients (FAO-56 Table 17) */
  kcb: CoefficientCurve;
  /** Kc of dry bare soil (default 0.15) */
  kcMin?: number;
  /** depth of the evaporating layer, m (default 0.10) */
  zeM?: number;
  /** override TEW and REW, mm (default: soil texture, FAO-56 Table 19 / eq. 73) */
  tewMm?: number;
  rewMm?: number;
}

/** Climate used to adjust Kc mid and Kc end (FAO-56 eq. 62, 65); missing values come from the weather days. */
export interface ClimateAdjustSpec {
  midWindMs?: number;
  midRhMinPct?: number;
  endWindMs?: number;
  endRhMinPct?: number;
}

/** The crop in the field this season. */
export interface PlantingSpec {
  plantingDate: string;
  /** FAO-56 Table 12 Kc ini / mid / end */
  kc: CoefficientCurve;
  /** FAO-56 Table 11 stage lengths */
  stages: StageLengths;
  /** crop height at mid-season, m (default 1) */
  heightM?: number;
  rootDepthMinM: number;
  rootDepthMaxM: number;
  /** FAO-56 Table 22 p */
  pTable: number;
  /** management allowed depletion as a fraction of TAW; default: the trigger is RAW */
  triggerMad?: number;
  /** adjust Kc mid and end for climate (eq. 62/65); true takes the means from the weather days */
  climateAdjust?: boolean | ClimateAdjustSpec;
  /** Kc outside the season (default Kc ini) */
  fallowKc?: number;
  dual?: DualSpec;
}

/** The irrigation system. */
export interface SystemSpec {
  /** application efficiency, 0-1 (net = gross × efficiency) */
  applicationEfficiency: number;
  /** fraction of the surface an irrigation wets, FAO-56 Table 20 (default 1) */
  wettedFraction?: number;
}

/** A day's reference ET, given directly. */
export interface GivenEtoDay {
  date: string;
  etoMm: number;
}

/** A day's weather: given ETo, or raw readings for FAO-56 Penman-Monteith. */
export type WeatherDayInput = GivenEtoDay | DailyWeather;

/** Where a day's rain came from. */
export interface RainSource {
  kind: "own-gauge" | "nearest" | "idw" | "manual" | "other";
  gauges?: GaugeWeight[];
  note?: string;
}

/** A daily total (a manual reading already booked to its account day, or interpolated). */
export interface RainDayTotal {
  date: string;
  kind: "total";
  /** null: the gauge was not read (missing is flagged, not filled) */
  rainMm: number | null;
  source?: RainSource;
}

/** The time-stamped record of an account day (see groupRecordsByAccountDay). */
export interface RainDayRecords {
  date: string;
  kind: "records";
  records: RainRecord[];
  source?: RainSource;
}

/** A day's rain: a daily total, or the time-stamped record of the account day. */
export type RainDayInput = RainDayTotal | RainDayRecords;

/** An irrigation as logged: gross depth (at the outlet) or net depth (into the root zone). */
export interface IrrigationEvent {
  date: string;
  depthMm: number;
  basis: "gross" | "net";
}

/** A soil check: measured root-zone depletion, mm, that resets the account at the start of the day. */
export interface SoilCheck {
  date: string;
  depletionMm: number;
}

/** Options of {@link runFieldAccount}. */
export interface FieldAccountOptions {
  /** what to do when a day has only temperatures (default 'hargreaves') */
  temperatureOnly?: "hargreaves" | "penman-monteith";
  /** storm separation and tip handling */
  storms?: HyetographOptions & { dryGapH?: number };
  kineticEnergyMethod?: KineticEnergyMethod;
  sealing?: SealingOptions & { enabled?: boolean };
  /** days of ETo averaged to fill a day without weather (default 7) */
  etoFillDays?: number;
}

/** Everything the engine needs for one field over a span of days. */
export interface FieldAccountInput {
  field: FieldSpec;
  planting: PlantingSpec;
  system: SystemSpec;
  /** needed when any weather day is raw */
  station?: StationSite;
  weather: readonly WeatherDayInput[];
  /**
   * ETo already computed for the field's station (computeStationEto), covering the span; when given,
   * `weather` is read only for the Kc climate adjustment and the dual coefficient's Kc max.
   */
  eto?: StationEtoSeries;
  rain: readonly RainDayInput[];
  irrigations?: readonly IrrigationEvent[];
  soilChecks?: readonly SoilCheck[];
  capillaryRise?: readonly { date: string; capillaryRiseMm: number }[];
  startDate: string;
  endDate: string;
  /** depletion at the start of `startDate`, mm (eq. 87) */
  initialDepletionMm: number;
  options?: FieldAccountOptions;
}

/** How a day's ETo was obtained. */
export interface EtoProvenance {
  method: "given" | "penman-monteith" | "hargreaves" | "filled-mean";
  estimated: readonly (EstimatedInput | "eto")[];
}

/** One time-stamped storm's runoff and energy. */
export interface StormRunoffRecord {
  startMs: number;
  endMs: number;
  rainMm: number;
  runoffMm: number;
  deltaTheta: number;
  ksatFactor: number;
  energyMJha: number;
  i30MmH: number;
  ei30: number;
}

/** How a day's runoff was worked out. */
export type RunoffProvenance =
  | { method: "none" }
  | {
      method: "curve-number";
      condition: AntecedentCondition;
      curveNumber: number;
      iaRatio: number;
      source: string;
    }
  | {
      method: "green-ampt";
      storms: readonly StormRunoffRecord[];
      sealed: boolean;
      sealFormed: boolean;
      droppedTips: number;
    };

/** Where a day's rain came from. */
export interface RainProvenance {
  source: RainSource["kind"] | "no-record";
  gauges: readonly GaugeWeight[];
  /** the reading was missing and counted as 0 */
  missing: boolean;
  /** time-stamped record (true) or a daily total */
  recorded: boolean;
}

/** Provenance of every term of a day. */
export interface DayProvenance {
  eto: EtoProvenance;
  rain: RainProvenance;
  runoff: RunoffProvenance;
  irrigation: "none" | "gross" | "net" | "mixed";
}

/** The books of a day: stored change against net inflow. */
export interface DayClosure {
  /** depletionStart − depletionEnd, mm */
  storedChangeMm: number;
  /** effective rain + net irrigation + capillary rise − actual ET − deep percolation, mm */
  netFlowMm: number;
  errorMm: number;
  /** |error| ≤ 0.01 mm */
  closes: boolean;
}

/** One row of the field's water account. */
export interface AccountDay {
  date: string;
  stage: CropStage;
  etoMm: number;
  /** potential crop coefficient of the day (Kc, or Kcb + Ke) */
  kc: number;
  /** dual coefficient only */
  kcb: number | null;
  ke: number | null;
  etcMm: number;
  ks: number;
  /** actual ET, mm */
  etcAdjMm: number;
  rainMm: number;
  runoffMm: number;
  effectiveRainMm: number;
  irrigationGrossMm: number;
  irrigationNetMm: number;
  capillaryRiseMm: number;
  deepPercolationMm: number;
  depletionStartMm: number;
  depletionEndMm: number;
  tawMm: number;
  rawMm: number;
  /** depletion at which the field is due: triggerMad × TAW, or RAW */
  triggerMm: number;
  pAdjusted: number;
  rootDepthM: number;
  /** a soil check replaced the carried depletion at the start of the day */
  soilCheckReset: boolean;
  /** the depletion the account carried into the day, before any soil check, mm */
  carriedDepletionMm: number;
  provenance: DayProvenance;
  closure: DayClosure;
}

/** Kc values used after the climate adjustment. */
export interface KcUsed {
  ini: number;
  mid: number;
  end: number;
  adjusted: boolean;
  midWindMs: number | null;
  midRhMinPct: number | null;
  endWindMs: number | null;
  endRhMinPct: number | null;
}

/** The account with its season-level facts. */
export interface FieldAccountResult {
  days: AccountDay[];
  kcUsed: KcUsed;
  /** true when every day closes within 0.01 mm */
  allClose: boolean;
  finalDepletionMm: number;
}
