/** The shape of a demo farm as the scenario describes it, before any rows are generated. */
import type { CropValues, SoilValues } from "./library";
import type { FieldShape, Origin, Pt } from "./layout";
import type { Method } from "./irrigation";

export interface SystemSpec {
  key: string;
  name: string;
  kind: "drip" | "pivot" | "furrow" | "flood";
  efficiency: number;
  flowM3H: number;
  capacityMmDay: number;
  depthPerPassMm?: number;
  pumpName?: string;
  /** How the team logs this system's sets, and the hour they usually start them. */
  method: Method;
  startHour: number;
  meterStart?: number;
}

export interface GaugeSpec {
  key: string;
  name: string;
  kind: "manual" | "recording";
  at: Pt;
  resolutionMm: number;
  /** Chance that a dry morning goes unread. */
  missDryDays: number;
}

export interface PlantingSpec {
  crop: string;
  /** Month and day within the season ('10-06'); months before July fall in the second calendar year. */
  sown: string;
  triggerShare: number;
  initialDepletionMm?: number;
  mad?: number;
  overrides?: Partial<Pick<CropValues, "kc_ini" | "kc_mid" | "kc_end" | "root_min_m" | "root_max_m" | "p">>;
  note?: string;
}

export interface FieldSetup {
  soil: string;
  system?: string;
  gauge?: string;
  slopePct: number;
  planting?: PlantingSpec;
}

export interface CheckSpec {
  field: string;
  daysAgo: number;
  /** The check reads the crude model's depletion times this (the model is never quite right). */
  bias: number;
  method: "probe" | "feel" | "sensor" | "gravimetric";
  depthM: number;
  by: string;
  note: string;
}

export interface FarmSpec {
  key: string;
  name: string;
  origin: Origin;
  elevationM: number;
  allocationMl: number;
  carryoverMl: number;
  /** Separates this farm's weather streams from the other's. */
  salt: string;
  /** Person keys (people.ts) who set the farm up, look after its equipment and its agronomy, and log. */
  people: { owner: string; equipment: string; agronomy: string; loggers: string[] };
  soils: SoilValues[];
  crops: CropValues[];
  systems: SystemSpec[];
  gauges: GaugeSpec[];
  station: { key: string; name: string; at: Pt };
  fields: FieldShape[];
  setup: Record<string, FieldSetup>;
  checks: CheckSpec[];
}
