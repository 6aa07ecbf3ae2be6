import type { AccountField, AccountPlanting, AccountSystem, FarmObservations, FarmSetup } from "@/db/account-inputs";
import {
  distanceKm,
  groupRecordsByAccountDay,
  type ClimateAdjustSpec,
  type FieldAccountInput,
  type PlantingSpec,
  type RainRecord,
  type RunoffCover,
  type StationSite,
  type TextureId,
  type WeatherDayInput,
} from "@/lib/waterbalance";
import { fieldRain, type DayRainSource, type GaugeDayReadings } from "./rain";
import { climateMeansForPlanting, StationEtoCache, type StationEto } from "./station-eto";

/**
 * Turns a farm's stored set-up and observations into the engine's plain inputs. Whatever is shared by
 * the farm's fields (weather by station, rain by gauge and day) is prepared once per farm; each field
 * then only picks its station and its gauges.
 */

/** Application efficiency when a field has no system: the logged depth is taken as what reached the roots. */
const NO_SYSTEM_EFFICIENCY = 1;

interface GaugeDay {
  rainMm: number;
  flagged: boolean;
  records?: RainRecord[];
}

/** The farm-wide part: station weather and gauge rain by day, ready to share between fields. */
export interface FarmInputContext {
  setup: FarmSetup;
  sites: Map<string, StationSite>;
  weatherByStation: Map<string, WeatherDayInput[]>;
  /** quality notes of the day's inputs, by station then date */
  weatherQc: Map<string, Map<string, string>>;
  gaugeDays: Map<string, Map<string, GaugeDay>>;
  /** gauges with a location, the only ones inverse-distance weighting can use */
  locatedGauges: { id: string; latitude: number; longitude: number; recording: boolean }[];
  plantingsByField: Map<string, AccountPlanting[]>;
  systems: Map<string, AccountSystem>;
  gaugeDayCache: Map<string, GaugeDayReadings>;
  /** climate means of a planting under a station, worked out once per farm run */
  climateCache: (stationId: string, planting: AccountPlanting, compute: () => ClimateAdjustSpec) => ClimateAdjustSpec;
}

export function buildFarmContext(setup: FarmSetup, obs: FarmObservations): FarmInputContext {
  const { farm } = setup;
  const countFlagged = farm.countFlaggedValues;
  const sites = new Map<string, StationSite>();
  for (const s of setup.stations) {
    sites.set(s.id, {
      latitudeDeg: s.latitude ?? farm.latitude ?? 0,
      elevationM: s.elevationM ?? farm.elevationM ?? 0,
      coastal: s.coastal,
      windHeightM: s.windHeightM,
    });
  }
  // Observed beats forecast for the same date; flagged days count only when the farm says so.
  const chosen = new Map<string, Map<string, FarmObservations["weather"][number]>>();
  const weatherQc = new Map<string, Map<string, string>>();
  for (const w of obs.weather) {
    let qc = weatherQc.get(w.stationId);
    if (!qc) weatherQc.set(w.stationId, (qc = new Map()));
    if (w.flagged) {
      qc.set(w.date, countFlagged ? "weather-flagged-counted" : "weather-flagged-excluded");
      if (!countFlagged) continue;
    }
    let byDate = chosen.get(w.stationId);
    if (!byDate) chosen.set(w.stationId, (byDate = new Map()));
    const had = byDate.get(w.date);
    if (!had || (had.kind === "forecast" && w.kind === "observed")) byDate.set(w.date, w);
    if (w.kind === "forecast" && (!had || had.kind === "forecast")) qc.set(w.date, "weather-forecast-used");
    else if (w.kind === "observed" && qc.get(w.date) === "weather-forecast-used") qc.delete(w.date);
  }
  const weatherByStation = new Map<string, WeatherDayInput[]>();
  for (const [stationId, byDate] of chosen) {
    const days: WeatherDayInput[] = [];
    for (const w of [...byDate.values()].sort((a, b) => (a.date < b.date ? -1 : 1))) {
      if (w.etoMm !== null) days.push({ date: w.date, etoMm: w.etoMm });
      else if (w.tmaxC !== null && w.tminC !== null) {
        days.push({
          date: w.date,
          tMaxC: w.tmaxC,
          tMinC: w.tminC,
          ...(w.rhMaxPct !== null ? { rhMaxPct: w.rhMaxPct } : {}),
          ...(w.rhMinPct !== null ? { rhMinPct: w.rhMinPct } : {}),
          ...(w.rhMeanPct !== null ? { rhMeanPct: w.rhMeanPct } : {}),
          ...(w.windMs !== null ? { windMs: w.windMs } : {}),
          ...(w.solarMJm2 !== null ? { solarMJm2: w.solarMJm2 } : {}),
          ...(w.sunshineH !== null ? { sunshineHours: w.sunshineH } : {}),
        });
      }
    }
    weatherByStation.set(stationId, days);
  }

  const gaugeDays = new Map<string, Map<string, GaugeDay>>();
  for (const g of setup.gauges) gaugeDays.set(g.id, new Map());
  for (const r of obs.readings) {
    if (r.flagged && !countFlagged) {
      gaugeDays.get(r.gaugeId)?.set(r.date, { rainMm: NaN, flagged: true });
      continue;
    }
    gaugeDays.get(r.gaugeId)?.set(r.date, { rainMm: r.depthMm, flagged: r.flagged });
  }
  const recordsByGauge = new Map<string, RainRecord[]>();
  const flaggedRecordGauges = new Set<string>();
  for (const r of obs.records) {
    if (r.flagged) flaggedRecordGauges.add(r.gaugeId);
    if (r.flagged && !countFlagged) continue;
    let list = recordsByGauge.get(r.gaugeId);
    if (!list) recordsByGauge.set(r.gaugeId, (list = []));
    list.push(r.intervalS !== null ? { at: r.atMs, depthMm: r.depthMm, intervalMin: r.intervalS / 60 } : { at: r.atMs, depthMm: r.depthMm });
  }
  for (const [gaugeId, records] of recordsByGauge) {
    const days = gaugeDays.get(gaugeId);
    if (!days) continue;
    for (const g of groupRecordsByAccountDay(records, farm.timeZone, farm.boundaryHour)) {
      days.set(g.date, { rainMm: g.rainMm, flagged: flaggedRecordGauges.has(gaugeId), records: g.records });
    }
  }
  const locatedGauges = setup.gauges
    .filter((g) => g.latitude !== null && g.longitude !== null)
    .map((g) => ({ id: g.id, latitude: g.latitude as number, longitude: g.longitude as number, recording: g.kind === "recording" }));
  const plantingsByField = new Map<string, AccountPlanting[]>();
  for (const p of setup.plantings) {
    const list = plantingsByField.get(p.fieldId);
    if (list) list.push(p);
    else plantingsByField.set(p.fieldId, [p]);
  }
  const climate = new Map<string, ClimateAdjustSpec>();
  return {
    setup,
    sites,
    weatherByStation,
    weatherQc,
    gaugeDays,
    locatedGauges,
    plantingsByField,
    systems: new Map(setup.systems.map((s) => [s.id, s])),
    gaugeDayCache: new Map(),
    climateCache: (stationId, planting, compute) => {
      const key = `${stationId}|${planting.plantingDate}|${planting.stageIniDays}|${planting.stageDevDays}|${planting.stageMidDays}|${planting.stageLateDays}`;
      let hit = climate.get(key);
      if (!hit) climate.set(key, (hit = compute()));
      return hit;
    },
  };
}

/** The station nearest the field (or the farm's first when locations are missing). */
export function nearestStationId(ctx: FarmInputContext, field: AccountField, withWeatherOnly = true): string | null {
  const stations = withWeatherOnly ? ctx.setup.stations.filter((s) => ctx.weatherByStation.has(s.id)) : ctx.setup.stations;
  if (stations.length === 0) return null;
  const lat = field.centroidLat ?? ctx.setup.farm.latitude;
  const lon = field.centroidLon ?? ctx.setup.farm.longitude;
  if (lat === null || lon === null) return stations[0]!.id;
  let best = stations[0]!;
  let bestKm = Infinity;
  for (const s of stations) {
    if (s.latitude === null || s.longitude === null) continue;
    const km = distanceKm({ latitudeDeg: lat, longitudeDeg: lon }, { latitudeDeg: s.latitude, longitudeDeg: s.longitude });
    if (km < bestKm) {
      bestKm = km;
      best = s;
    }
  }
  return best.id;
}

/**
 * The planting spec: crop values with the planting's overrides (already merged by the loader). A
 * calibration's Kc scale multiplies the three table values (capped at 2); the engine then adjusts mid and end for
 * climate (FAO-56 eq. 62) as usual.
 */
export function plantingSpec(p: AccountPlanting): PlantingSpec {
  // Kc stays within the engine's 0-2 (twice the grass reference is no crop's).
  const scaled = (kc: number) => Math.min(2, kc * p.kcScale);
  return {
    plantingDate: p.plantingDate,
    kc: { ini: scaled(p.kcIni), mid: scaled(p.kcMid), end: scaled(p.kcEnd) },
    stages: { iniDays: p.stageIniDays, devDays: p.stageDevDays, midDays: p.stageMidDays, lateDays: p.stageLateDays },
    ...(p.heightM !== null ? { heightM: p.heightM } : {}),
    rootDepthMinM: p.rootMinM,
    rootDepthMaxM: p.rootMaxM,
    pTable: p.p,
    ...(p.mad !== null ? { triggerMad: p.mad } : {}),
    climateAdjust: p.climateAdjust,
  };
}

/** The field part of the engine input (soil, area, runoff); null when the field has no soil. */
export function fieldSpec(field: AccountField, planting: AccountPlanting): FieldAccountInput["field"] | null {
  const s = field.soil;
  if (!s) return null;
  const greenAmpt = {
    ...(s.gaPorosity !== null ? { porosity: s.gaPorosity } : {}),
    ...(s.gaEffectivePorosity !== null ? { effectivePorosity: s.gaEffectivePorosity } : {}),
    ...(s.gaSuctionMm !== null ? { suctionMm: s.gaSuctionMm } : {}),
    ...(s.gaKsatMmH !== null ? { ksatMmH: s.gaKsatMmH } : {}),
  };
  const curveNumber = field.curveNumber ?? planting.cropCurveNumber;
  return {
    soil: {
      texture: s.texture as TextureId,
      thetaFc: s.thetaFc,
      thetaWp: s.thetaWp,
      greenAmpt,
      ...(s.rewMm !== null ? { rewMm: s.rewMm } : {}),
      ...(s.tewMm !== null ? { tewMm: s.tewMm } : {}),
    },
    areaHa: field.areaHa,
    ...(field.slopePct !== null ? { slopePct: field.slopePct } : {}),
    runoff: {
      ...(curveNumber !== null ? { curveNumber } : {}),
      ...(s.hydrologicGroup ? { hydrologicSoilGroup: s.hydrologicGroup } : {}),
      ...(planting.runoffCover ? { cover: planting.runoffCover as RunoffCover } : {}),
    },
  };
}

export function systemEfficiency(ctx: FarmInputContext, field: AccountField): number {
  const sys = field.systemId ? ctx.systems.get(field.systemId) : undefined;
  return sys?.applicationEfficiency ?? NO_SYSTEM_EFFICIENCY;
}

/** One run of the engine for a field: a planting over a span, with what it starts from. */
export interface FieldRun {
  field: AccountField;
  planting: AccountPlanting;
  stationId: string;
  input: FieldAccountInput;
  eto: StationEto;
  rainSources: DayRainSource[];
  /** quality notes by date (weather and rain) */
  qc: Map<string, string[]>;
}

/**
 * The engine input for `field` under `planting` from `from` to `to`, starting at `initialDepletionMm`.
 * Returns null when the field cannot have an account (no soil, or no weather station with days).
 */
export function buildFieldRun(
  ctx: FarmInputContext,
  etoCache: StationEtoCache,
  field: AccountField,
  planting: AccountPlanting,
  span: { from: string; to: string; initialDepletionMm: number },
  byField: { irrigations: Map<string, FarmObservations["irrigations"]>; soilChecks: Map<string, FarmObservations["soilChecks"]> },
): FieldRun | null {
  const spec = fieldSpec(field, planting);
  const stationId = nearestStationId(ctx, field);
  if (!spec || !stationId) return null;
  const site = ctx.sites.get(stationId);
  const weather = ctx.weatherByStation.get(stationId) ?? [];
  const eto = etoCache.get(stationId, weather, site, span.from, span.to);
  const { rain, sources, qc: rainQc } = fieldRain(ctx, field, span.from, span.to);
  const qc = new Map<string, string[]>();
  for (const [date, note] of ctx.weatherQc.get(stationId) ?? []) if (date >= span.from && date <= span.to) qc.set(date, [note]);
  for (const [date, note] of rainQc) {
    const list = qc.get(date);
    if (list) list.push(note);
    else qc.set(date, [note]);
  }
  const inSpan = (d: string) => d >= span.from && d <= span.to;
  const pl = plantingSpec(planting);
  if (planting.climateAdjust) {
    pl.climateAdjust = ctx.climateCache(stationId, planting, () => climateMeansForPlanting(weather, pl.plantingDate, pl.stages, site?.windHeightM ?? 2));
  }
  const input: FieldAccountInput = {
    field: spec,
    planting: pl,
    system: { applicationEfficiency: systemEfficiency(ctx, field) },
    ...(site ? { station: site } : {}),
    weather: eto.weather,
    rain,
    irrigations: (byField.irrigations.get(field.id) ?? [])
      .filter((e) => inSpan(e.date))
      .map((e) => (e.netDepthMm !== null ? { date: e.date, depthMm: e.netDepthMm, basis: "net" as const } : { date: e.date, depthMm: e.grossDepthMm, basis: "gross" as const })),
    // The last check of a day wins (rows come ordered by time).
    soilChecks: [...new Map((byField.soilChecks.get(field.id) ?? []).filter((c) => inSpan(c.date)).map((c) => [c.date, c])).values()].map((c) => ({
      date: c.date,
      depletionMm: c.depletionMm,
    })),
    startDate: span.from,
    endDate: span.to,
    initialDepletionMm: span.initialDepletionMm,
  };
  return { field, planting, stationId, input, eto, rainSources: sources, qc };
}

/** Groups rows by field id. */
export function byFieldId<T extends { fieldId: string }>(rows: readonly T[]): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const r of rows) {
    const list = out.get(r.fieldId);
    if (list) list.push(r);
    else out.set(r.fieldId, [r]);
  }
  return out;
}
