import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";

/**
 * Everything the water-balance engine needs for a farm's fields, read in a handful of set-based
 * queries (one per table), never one query per field or per day.
 */

export interface AccountFarm {
  id: string;
  timeZone: string;
  boundaryHour: number;
  latitude: number | null;
  longitude: number | null;
  elevationM: number | null;
  countFlaggedValues: boolean;
}

export interface AccountSoil {
  texture: string;
  thetaFc: number;
  thetaWp: number;
  thetaSat: number;
  rewMm: number | null;
  tewMm: number | null;
  gaSuctionMm: number | null;
  gaKsatMmH: number | null;
  gaPorosity: number | null;
  gaEffectivePorosity: number | null;
  hydrologicGroup: "A" | "B" | "C" | "D" | null;
}

export interface AccountField {
  id: string;
  name: string;
  areaHa: number;
  centroidLat: number | null;
  centroidLon: number | null;
  slopePct: number | null;
  curveNumber: number | null;
  gaugeId: string | null;
  systemId: string | null;
  dirtyFrom: string | null;
  dirtySeq: number;
  soil: AccountSoil | null;
}

export interface AccountPlanting {
  id: string;
  fieldId: string;
  plantingDate: string;
  endDate: string | null;
  kcIni: number;
  kcMid: number;
  kcEnd: number;
  stageIniDays: number;
  stageDevDays: number;
  stageMidDays: number;
  stageLateDays: number;
  heightM: number | null;
  rootMinM: number;
  rootMaxM: number;
  p: number;
  mad: number | null;
  climateAdjust: boolean;
  /** calibration factor on Kc ini, mid and end (1 = none) */
  kcScale: number;
  initialDepletionMm: number;
  cropCurveNumber: number | null;
  runoffCover: string | null;
}

export interface AccountSystem {
  id: string;
  kind: string;
  applicationEfficiency: number;
  flowM3H: number | null;
  capacityMmDay: number | null;
  depthPerPassMm: number | null;
  pumpName: string | null;
}

export interface AccountStation {
  id: string;
  latitude: number | null;
  longitude: number | null;
  elevationM: number | null;
  windHeightM: number;
  coastal: boolean;
}

export interface AccountGauge {
  id: string;
  kind: "manual" | "recording";
  latitude: number | null;
  longitude: number | null;
}

/** A farm's set-up as the account sees it. */
export interface FarmSetup {
  farm: AccountFarm;
  fields: AccountField[];
  plantings: AccountPlanting[];
  systems: AccountSystem[];
  stations: AccountStation[];
  gauges: AccountGauge[];
}

export interface WeatherDayRow {
  stationId: string;
  date: string;
  kind: "observed" | "forecast";
  tmaxC: number | null;
  tminC: number | null;
  rhMaxPct: number | null;
  rhMinPct: number | null;
  rhMeanPct: number | null;
  windMs: number | null;
  solarMJm2: number | null;
  sunshineH: number | null;
  rainMm: number | null;
  etoMm: number | null;
  flagged: boolean;
}

export interface RainReadingRow {
  gaugeId: string;
  date: string;
  depthMm: number;
  flagged: boolean;
}

export interface RainRecordRow {
  gaugeId: string;
  atMs: number;
  depthMm: number;
  intervalS: number | null;
  flagged: boolean;
}

export interface IrrigationRow {
  fieldId: string;
  date: string;
  grossDepthMm: number;
  netDepthMm: number | null;
}

export interface SoilCheckRow {
  fieldId: string;
  date: string;
  depletionMm: number;
}

/** Observations over a span of account days. */
export interface FarmObservations {
  weather: WeatherDayRow[];
  readings: RainReadingRow[];
  records: RainRecordRow[];
  irrigations: IrrigationRow[];
  soilChecks: SoilCheckRow[];
}

type Row = Record<string, unknown>;
const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));
const str = (v: unknown): string | null => (v === null || v === undefined ? null : String(v));

function toSoil(r: Row): AccountSoil | null {
  if (r.theta_fc === null || r.theta_fc === undefined) return null;
  return {
    texture: String(r.texture),
    thetaFc: Number(r.theta_fc),
    thetaWp: Number(r.theta_wp),
    thetaSat: Number(r.theta_sat),
    rewMm: num(r.rew_mm),
    tewMm: num(r.tew_mm),
    gaSuctionMm: num(r.ga_suction_mm),
    gaKsatMmH: num(r.ga_ksat_mm_h),
    gaPorosity: num(r.ga_porosity),
    gaEffectivePorosity: num(r.ga_effective_porosity),
    hydrologicGroup: (r.hydrologic_group as AccountSoil["hydrologicGroup"]) ?? null,
  };
}

export function toAccountField(r: Row): AccountField {
  return {
    id: String(r.id),
    name: String(r.name),
    areaHa: Number(r.area_ha),
    centroidLat: num(r.centroid_lat),
    centroidLon: num(r.centroid_lon),
    slopePct: num(r.slope_pct),
    curveNumber: num(r.curve_number),
    gaugeId: str(r.gauge_id),
    systemId: str(r.irrigation_system_id),
    dirtyFrom: str(r.account_dirty_from),
    dirtySeq: Number(r.account_dirty_seq ?? 0),
    soil: toSoil(r),
  };
}

export function toAccountPlanting(r: Row): AccountPlanting {
  return {
    id: String(r.id),
    fieldId: String(r.field_id),
    plantingDate: String(r.planting_date),
    endDate: str(r.end_date),
    kcIni: Number(r.kc_ini),
    kcMid: Number(r.kc_mid),
    kcEnd: Number(r.kc_end),
    stageIniDays: Number(r.stage_ini_days),
    stageDevDays: Number(r.stage_dev_days),
    stageMidDays: Number(r.stage_mid_days),
    stageLateDays: Number(r.stage_late_days),
    heightM: num(r.height_m),
    rootMinM: Number(r.root_min_m),
    rootMaxM: Number(r.root_max_m),
    p: Number(r.p),
    mad: num(r.mad),
    climateAdjust: Boolean(r.climate_adjust),
    kcScale: num(r.kc_scale) ?? 1,
    initialDepletionMm: Number(r.initial_depletion_mm),
    cropCurveNumber: num(r.crop_curve_number),
    runoffCover: str(r.runoff_cover),
  };
}

/**
 * The farm, its live fields (all, or those whose account is dirty, or the given ids) with their soils,
 * the plantings of those fields (crop values overridden by the planting's own), and the farm's systems,
 * stations and gauges.
 */
export async function loadFarmSetup(
  farmId: string,
  which: "all" | "dirty" | { fieldIds: readonly string[] },
  conn: Knex | Knex.Transaction = db,
): Promise<FarmSetup | null> {
  const farmRow = (await conn("farms").where({ id: farmId }).first()) as Row | undefined;
  if (!farmRow) return null;
  const farm: AccountFarm = {
    id: farmId,
    timeZone: String(farmRow.time_zone),
    boundaryHour: Number(farmRow.rain_day_boundary_hour),
    latitude: num(farmRow.latitude),
    longitude: num(farmRow.longitude),
    elevationM: num(farmRow.elevation_m),
    countFlaggedValues: Boolean(farmRow.count_flagged_values),
  };
  const fieldQuery = conn("fields as f")
    .leftJoin("soils as s", "s.id", "f.soil_id")
    .where("f.farm_id", farmId)
    .whereNull("f.archived_at")
    .select(
      "f.id", "f.name", "f.area_ha", "f.centroid_lat", "f.centroid_lon", "f.slope_pct", "f.curve_number", "f.gauge_id",
      "f.irrigation_system_id", "f.account_dirty_from", "f.account_dirty_seq",
      "s.texture", "s.theta_fc", "s.theta_wp", "s.theta_sat", "s.rew_mm", "s.tew_mm", "s.ga_suction_mm", "s.ga_ksat_mm_h",
      "s.ga_porosity", "s.ga_effective_porosity", "s.hydrologic_group",
    )
    .orderBy("f.id");
  if (which === "dirty") fieldQuery.whereNotNull("f.account_dirty_from");
  else if (which !== "all") fieldQuery.whereIn("f.id", which.fieldIds);
  const fields = ((await fieldQuery) as Row[]).map(toAccountField);
  const plantingRows = fields.length
    ? ((await conn("plantings as p")
        .join("crops as c", "c.id", "p.crop_id")
        .join("fields as f", "f.id", "p.field_id")
        .where("f.farm_id", farmId)
        .whereIn("p.field_id", fields.map((f) => f.id))
        .orderBy([{ column: "p.field_id" }, { column: "p.planting_date" }])
        .select(
          "p.id", "p.field_id", "p.planting_date", "p.end_date", "p.mad", "p.climate_adjust", "p.kc_scale", "p.initial_depletion_mm",
          conn.raw("coalesce(p.kc_ini, c.kc_ini) as kc_ini"),
          conn.raw("coalesce(p.kc_mid, c.kc_mid) as kc_mid"),
          conn.raw("coalesce(p.kc_end, c.kc_end) as kc_end"),
          conn.raw("coalesce(p.stage_ini_days, c.stage_ini_days) as stage_ini_days"),
          conn.raw("coalesce(p.stage_dev_days, c.stage_dev_days) as stage_dev_days"),
          conn.raw("coalesce(p.stage_mid_days, c.stage_mid_days) as stage_mid_days"),
          conn.raw("coalesce(p.stage_late_days, c.stage_late_days) as stage_late_days"),
          conn.raw("coalesce(p.root_min_m, c.root_min_m) as root_min_m"),
          conn.raw("coalesce(p.root_max_m, c.root_max_m) as root_max_m"),
          conn.raw("coalesce(p.p, c.p) as p"),
          "c.height_m", "c.curve_number as crop_curve_number", "c.runoff_cover",
        )) as Row[])
    : [];
  const systems = ((await conn("irrigation_systems").where({ farm_id: farmId })) as Row[]).map((r) => ({
    id: String(r.id),
    kind: String(r.kind),
    applicationEfficiency: Number(r.application_efficiency),
    flowM3H: num(r.flow_m3_h),
    capacityMmDay: num(r.capacity_mm_day),
    depthPerPassMm: num(r.depth_per_pass_mm),
    pumpName: str(r.pump_name),
  }));
  const stations = ((await conn("weather_stations").where({ farm_id: farmId }).whereNull("archived_at")) as Row[]).map((r) => ({
    id: String(r.id),
    latitude: num(r.latitude),
    longitude: num(r.longitude),
    elevationM: num(r.elevation_m),
    windHeightM: Number(r.wind_height_m),
    coastal: Boolean(r.coastal),
  }));
  const gauges = ((await conn("gauges").where({ farm_id: farmId }).whereNull("archived_at")) as Row[]).map((r) => ({
    id: String(r.id),
    kind: r.kind as AccountGauge["kind"],
    latitude: num(r.latitude),
    longitude: num(r.longitude),
  }));
  return { farm, fields, plantings: plantingRows.map(toAccountPlanting), systems, stations, gauges };
}

/**
 * The farm's observations for account days `from`..`to`: weather of its stations, rain of its gauges
 * (readings by rain day; records by instant, a day either side so the reading-day rule can book them),
 * and the irrigations and soil checks of `fieldIds`.
 */
export async function loadFarmObservations(
  setup: FarmSetup,
  fieldIds: readonly string[],
  span: { from: string; to: string; weatherFrom?: string },
  conn: Knex | Knex.Transaction = db,
): Promise<FarmObservations> {
  const stationIds = setup.stations.map((s) => s.id);
  const gaugeIds = setup.gauges.map((g) => g.id);
  const [weather, readings, records, irrigations, soilChecks] = await Promise.all([
    stationIds.length
      ? conn("weather_days")
          .whereIn("station_id", stationIds)
          .whereBetween("date", [span.weatherFrom ?? span.from, span.to])
          .select("station_id", "date", "kind", "tmax_c", "tmin_c", "rh_max_pct", "rh_min_pct", "rh_mean_pct", "wind_ms",
            "solar_mj_m2", "sunshine_h", "rain_mm", "eto_mm", "flagged")
      : [],
    gaugeIds.length
      ? conn("rain_readings").whereIn("gauge_id", gaugeIds).whereBetween("rain_date", [span.from, span.to])
          .select("gauge_id", "rain_date", "depth_mm", "flagged")
      : [],
    gaugeIds.length
      ? conn("rain_records")
          .whereIn("gauge_id", gaugeIds)
          .where("at", ">", conn.raw("?::date - interval '1 day'", [span.from]))
          .where("at", "<", conn.raw("?::date + interval '3 days'", [span.to]))
          .select("gauge_id", conn.raw("(extract(epoch from at) * 1000)::float8 as at_ms"), "depth_mm", "interval_s", "flagged")
      : [],
    fieldIds.length
      ? conn("irrigation_events").whereIn("field_id", fieldIds).whereBetween("date", [span.from, span.to])
          .select("field_id", "date", "gross_depth_mm", "net_depth_mm")
      : [],
    fieldIds.length
      ? conn("soil_checks").whereIn("field_id", fieldIds).where("resets_account", true).whereBetween("date", [span.from, span.to])
          .orderBy([{ column: "field_id" }, { column: "date" }, { column: "checked_at" }])
          .select("field_id", "date", "depletion_mm")
      : [],
  ]);
  return {
    weather: (weather as Row[]).map((r) => ({
      stationId: String(r.station_id),
      date: String(r.date),
      kind: r.kind as WeatherDayRow["kind"],
      tmaxC: num(r.tmax_c),
      tminC: num(r.tmin_c),
      rhMaxPct: num(r.rh_max_pct),
      rhMinPct: num(r.rh_min_pct),
      rhMeanPct: num(r.rh_mean_pct),
      windMs: num(r.wind_ms),
      solarMJm2: num(r.solar_mj_m2),
      sunshineH: num(r.sunshine_h),
      rainMm: num(r.rain_mm),
      etoMm: num(r.eto_mm),
      flagged: Boolean(r.flagged),
    })),
    readings: (readings as Row[]).map((r) => ({ gaugeId: String(r.gauge_id), date: String(r.rain_date), depthMm: Number(r.depth_mm), flagged: Boolean(r.flagged) })),
    records: (records as Row[]).map((r) => ({
      gaugeId: String(r.gauge_id),
      atMs: Number(r.at_ms),
      depthMm: Number(r.depth_mm),
      intervalS: num(r.interval_s),
      flagged: Boolean(r.flagged),
    })),
    irrigations: (irrigations as Row[]).map((r) => ({
      fieldId: String(r.field_id),
      date: String(r.date),
      grossDepthMm: Number(r.gross_depth_mm),
      netDepthMm: num(r.net_depth_mm),
    })),
    soilChecks: (soilChecks as Row[]).map((r) => ({ fieldId: String(r.field_id), date: String(r.date), depletionMm: Number(r.depletion_mm) })),
  };
}
