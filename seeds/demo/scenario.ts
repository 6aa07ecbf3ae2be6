/**
 * Turns the demo farms into table rows for a given local "today". Pure: no database, no clock, so the
 * same date always gives the same rows (password hashes, added by the seed, are the one exception).
 */
import { bucketTips, calendarDayRainMm, manualReadings } from "./rain";
import { hargreavesEtoMm, stormStartingOn, stormsBetween, weatherDay, type WeatherDay } from "./climate";
import { addDays, eachDay, localInstant } from "./dates";
import { simulateIrrigation, type SimField, type SimSystem } from "./irrigation";
import { placeAt, type Pt } from "./layout";
import { LIBRARY_CROPS, LIBRARY_SOILS, type CropValues, type SoilValues } from "./library";
import type { FarmSpec } from "./farm-spec";
import { MEMBERSHIPS, PEOPLE } from "./people";
import { demoId, stream } from "./random";

export const TIME_ZONE = "Australia/Sydney";

export type Row = Record<string, unknown>;

/** Rows per table, in an order that satisfies the foreign keys. */
export interface DemoRows {
  users: Row[];
  farms: Row[];
  memberships: Row[];
  soils: Row[];
  crops: Row[];
  irrigation_systems: Row[];
  gauges: Row[];
  weather_stations: Row[];
  fields: Row[];
  plantings: Row[];
  weather_days: Row[];
  rain_readings: Row[];
  rain_records: Row[];
  irrigation_events: Row[];
  soil_checks: Row[];
  audit_log: Row[];
}

/** The irrigation season a local day falls in: it starts on 1 July, like the water year. */
export function seasonOf(today: string): { startYear: number; label: string; start: string } {
  const year = Number(today.slice(0, 4));
  const startYear = Number(today.slice(5, 7)) >= 7 ? year : year - 1;
  return {
    startYear,
    label: `${startYear}-${String((startYear + 1) % 100).padStart(2, "0")}`,
    start: `${startYear}-07-01`,
  };
}

const userId = (key: string) => demoId(`user/${key}`);

const libSoilId = (name: string) => demoId(`library/soil/${name}`);
const libCropId = (name: string) => demoId(`library/crop/${name}`);

function emptyRows(): DemoRows {
  return {
    users: [],
    farms: [],
    memberships: [],
    soils: [],
    crops: [],
    irrigation_systems: [],
    gauges: [],
    weather_stations: [],
    fields: [],
    plantings: [],
    weather_days: [],
    rain_readings: [],
    rain_records: [],
    irrigation_events: [],
    soil_checks: [],
    audit_log: [],
  };
}

/** All demo rows for local day `today` (YYYY-MM-DD in Australia/Sydney). */
export function buildDemo(today: string, farms: readonly FarmSpec[]): DemoRows {
  const rows = emptyRows();
  for (const p of PEOPLE)
    rows.users.push({ id: userId(p.key), email: p.email, name: p.name, unit_system: "metric" });
  for (const s of LIBRARY_SOILS) rows.soils.push({ id: libSoilId(s.name), farm_id: null, ...s });
  for (const c of LIBRARY_CROPS) rows.crops.push({ id: libCropId(c.name), farm_id: null, ...c });
  for (const spec of farms) buildFarm(spec, today, rows);
  return rows;
}

function buildFarm(spec: FarmSpec, today: string, rows: DemoRows): void {
  const tz = TIME_ZONE;
  const season = seasonOf(today);
  const yesterday = addDays(today, -1);
  // The demo's "now" is after the morning gauge round: readings up to yesterday are in, sets have ended.
  const cutoffMs = localInstant(today, 9, tz).getTime();
  const farmId = demoId(spec.key);
  const id = (what: string) => demoId(`${spec.key}/${what}`);
  const by = spec.people;

  rows.farms.push({
    id: farmId,
    name: spec.name,
    time_zone: tz,
    unit_system: "metric",
    latitude: spec.origin.latitude,
    longitude: spec.origin.longitude,
    elevation_m: spec.elevationM,
    rain_day_boundary_hour: 9,
    allocation_ml: spec.allocationMl,
    carryover_ml: spec.carryoverMl,
    water_year_start_month: 7,
    count_flagged_values: false,
    created_by: userId(by.owner),
    updated_by: userId(by.owner),
  });
  for (const [person, role] of Object.entries(MEMBERSHIPS[spec.key] ?? {})) {
    rows.memberships.push({ user_id: userId(person), farm_id: farmId, role, created_by: userId(by.owner) });
  }

  // Soils and crops: the farm's own first, then the library's, by name.
  const soils = new Map<string, { id: string; values: SoilValues }>();
  for (const s of LIBRARY_SOILS) soils.set(s.name, { id: libSoilId(s.name), values: s });
  for (const s of spec.soils) {
    soils.set(s.name, { id: id(`soil/${s.name}`), values: s });
    rows.soils.push({ id: id(`soil/${s.name}`), farm_id: farmId, ...s, created_by: userId(by.agronomy) });
  }
  const crops = new Map<string, { id: string; values: CropValues }>();
  for (const c of LIBRARY_CROPS) crops.set(c.name, { id: libCropId(c.name), values: c });
  for (const c of spec.crops) {
    crops.set(c.name, { id: id(`crop/${c.name}`), values: c });
    rows.crops.push({ id: id(`crop/${c.name}`), farm_id: farmId, ...c, created_by: userId(by.agronomy) });
  }

  for (const s of spec.systems) {
    rows.irrigation_systems.push({
      id: id(`system/${s.key}`),
      farm_id: farmId,
      name: s.name,
      kind: s.kind,
      application_efficiency: s.efficiency,
      flow_m3_h: s.flowM3H,
      capacity_mm_day: s.capacityMmDay,
      depth_per_pass_mm: s.depthPerPassMm ?? null,
      pump_name: s.pumpName ?? null,
      created_by: userId(by.equipment),
    });
  }
  for (const g of spec.gauges) {
    rows.gauges.push({
      id: id(`gauge/${g.key}`),
      farm_id: farmId,
      name: g.name,
      kind: g.kind,
      ...placeAt(spec.origin, g.at),
      resolution_mm: g.resolutionMm,
      created_by: userId(by.equipment),
    });
  }
  const stationId = id(`station/${spec.station.key}`);
  rows.weather_stations.push({
    id: stationId,
    farm_id: farmId,
    name: spec.station.name,
    ...placeAt(spec.origin, spec.station.at),
    elevation_m: spec.elevationM,
    wind_height_m: 2,
    coastal: false,
    created_by: userId(by.equipment),
  });

  // Weather: every day of the season so far, each drawn from its own date.
  const storms = stormsBetween(addDays(season.start, -1), today, tz, spec.salt);
  const site = { latitude: spec.origin.latitude, elevationM: spec.elevationM, salt: spec.salt };
  const weather = new Map<string, WeatherDay>();
  for (const date of eachDay(season.start, yesterday)) {
    const rainMm = calendarDayRainMm(storms, `${spec.salt}/station`, date, tz);
    const day = weatherDay(
      site,
      date,
      rainMm,
      stormStartingOn(addDays(date, 1), tz, spec.salt) !== undefined,
    );
    weather.set(date, day);
    rows.weather_days.push({
      id: id(`weather/${date}`),
      station_id: stationId,
      kind: "observed",
      ...day,
      sunshine_h: null, // an automatic station measures radiation, not sunshine hours
      eto_mm: null, // left to the engine (FAO-56 Penman-Monteith)
      source: `${spec.station.name} (demo data)`,
    });
  }

  // Rain at each gauge, booked to rain days (09:00 to 09:00) for manual gauges and for the fields' use.
  const rainByGauge = new Map<string, Map<string, number>>();
  for (const g of spec.gauges) {
    const place = `${spec.salt}/gauge/${g.key}`;
    const readings = manualReadings(
      storms,
      place,
      { from: season.start, to: yesterday },
      { timeZone: tz, boundaryHour: 9, missDryDays: g.kind === "manual" ? g.missDryDays : 0 },
    );
    rainByGauge.set(g.key, new Map(readings.map((r) => [r.rain_date, r.depth_mm])));
    if (g.kind === "manual") {
      for (const r of readings) {
        const logger = pick(by.loggers, stream(place, r.rain_date, "logger").next());
        rows.rain_readings.push({
          id: id(`reading/${g.key}/${r.rain_date}`),
          gauge_id: id(`gauge/${g.key}`),
          ...r,
          created_by: userId(logger),
          created_at: r.read_at,
          updated_at: r.read_at,
        });
      }
    } else {
      const seasonStartMs = localInstant(season.start, 0, tz).getTime();
      for (const tip of bucketTips(storms, place, g.resolutionMm, cutoffMs)) {
        if (tip.at.getTime() < seasonStartMs) continue;
        rows.rain_records.push({
          gauge_id: id(`gauge/${g.key}`),
          ...tip,
          interval_s: null,
          created_at: tip.at,
        });
      }
    }
  }

  const simFields: SimField[] = [];
  for (const shape of spec.fields) {
    const setup = spec.setup[shape.key];
    if (!setup) throw new Error(`${spec.key}: no setup for field ${shape.key}`);
    const soil = soils.get(setup.soil);
    if (!soil) throw new Error(`${spec.key}: no soil '${setup.soil}'`);
    const fieldId = id(`field/${shape.key}`);
    rows.fields.push({
      id: fieldId,
      farm_id: farmId,
      name: shape.name,
      boundary: JSON.stringify(shape.boundary),
      area_ha: shape.areaHa,
      centroid_lat: shape.centroidLat,
      centroid_lon: shape.centroidLon,
      soil_id: soil.id,
      slope_pct: setup.slopePct,
      irrigation_system_id: setup.system ? id(`system/${setup.system}`) : null,
      gauge_id: setup.gauge ? id(`gauge/${setup.gauge}`) : null,
      // The recompute job has never run on the demo: the whole season is waiting for it.
      account_dirty_from: season.start,
      created_by: userId(by.equipment),
    });

    const plan = setup.planting;
    if (!plan) continue;
    const crop = crops.get(plan.crop);
    if (!crop) throw new Error(`${spec.key}: no crop '${plan.crop}'`);
    const sown = `${plan.sown >= "07" ? season.startYear : season.startYear + 1}-${plan.sown}`;
    rows.plantings.push({
      id: id(`planting/${shape.key}/${season.label}`),
      field_id: fieldId,
      season: season.label,
      crop_id: crop.id,
      planting_date: sown,
      end_date: null,
      ...(plan.overrides ?? {}),
      mad: plan.mad ?? null,
      climate_adjust: true,
      initial_depletion_mm: plan.initialDepletionMm ?? 0,
      note: plan.note ?? null,
      created_by: userId(by.agronomy),
    });

    const system = spec.systems.find((s) => s.key === setup.system);
    if (!system) continue;
    const gaugeKey = setup.gauge ?? nearestGauge(spec, shape.centroidLocal);
    const rain = rainByGauge.get(gaugeKey);
    const simSystem: SimSystem = {
      key: system.key,
      kind: system.kind,
      efficiency: system.efficiency,
      flowM3H: system.flowM3H,
      depthPerPassMm: system.depthPerPassMm,
      startHour: system.startHour,
      method: system.method,
      meterStart: system.meterStart,
    };
    simFields.push({
      key: shape.key,
      areaHa: shape.areaHa,
      thetaFc: soil.values.theta_fc,
      thetaWp: soil.values.theta_wp,
      crop: { ...crop.values, ...(plan.overrides ?? {}) },
      plantingDate: sown,
      initialDepletionMm: plan.initialDepletionMm ?? 0,
      triggerShare: plan.triggerShare,
      system: simSystem,
      rainMm: (date) => rain?.get(date) ?? 0,
      checks: spec.checks
        .filter((c) => c.field === shape.key)
        .map((c) => ({ date: addDays(today, -c.daysAgo), bias: c.bias })),
    });
  }

  const sim = simulateIrrigation(
    simFields,
    (date) => {
      const day = weather.get(date);
      return day ? hargreavesEtoMm(spec.origin.latitude, day) : 0;
    },
    { from: season.start, lastDay: yesterday, cutoffMs, timeZone: tz },
  );
  for (const e of sim.events) {
    const logger = pick(by.loggers, stream(spec.key, e.fieldKey, e.date, "logger").next());
    const loggedAt = new Date(e.endedAt.getTime() + 20 * 60_000);
    rows.irrigation_events.push({
      id: id(`irrigation/${e.fieldKey}/${e.date}`),
      field_id: id(`field/${e.fieldKey}`),
      system_id: id(`system/${e.systemKey}`),
      started_at: e.startedAt,
      ended_at: e.endedAt,
      date: e.date,
      gross_depth_mm: e.grossMm,
      net_depth_mm: null,
      volume_m3: e.volumeM3,
      meter_start: e.meterStart,
      meter_end: e.meterEnd,
      hours: e.hours,
      method: e.method,
      note: null,
      created_by: userId(logger),
      created_at: loggedAt,
      updated_at: loggedAt,
    });
  }
  for (const c of sim.checks) {
    const check = spec.checks.find((s) => s.field === c.fieldKey && addDays(today, -s.daysAgo) === c.date);
    if (!check) continue;
    const checkedAt = localInstant(c.date, 10.5, tz);
    rows.soil_checks.push({
      id: id(`soil-check/${c.fieldKey}/${c.date}`),
      field_id: id(`field/${c.fieldKey}`),
      date: c.date,
      checked_at: checkedAt,
      depletion_mm: c.depletionMm,
      method: check.method,
      depth_m: check.depthM,
      resets_account: true,
      note: check.note,
      created_by: userId(check.by),
      created_at: checkedAt,
      updated_at: checkedAt,
    });
  }

  rows.audit_log.push({
    farm_id: farmId,
    user_id: null,
    actor: "system",
    action: "import",
    entity: "farm",
    entity_id: farmId,
    after: JSON.stringify({ name: spec.name, fields: spec.fields.length, season: season.label }),
    reason: "Demo scenario loaded by seeds/01_demo_farm.ts",
  });
}

function pick<T>(items: readonly T[], u: number): T {
  const item = items[Math.min(items.length - 1, Math.floor(u * items.length))];
  if (item === undefined) throw new Error("nothing to pick from");
  return item;
}

/** The gauge nearest a point of the farm's plane (fields without their own gauge). */
function nearestGauge(spec: FarmSpec, p: Pt): string {
  let best = spec.gauges[0];
  let bestD = Infinity;
  for (const g of spec.gauges) {
    const d = Math.hypot(g.at[0] - p[0], g.at[1] - p[1]);
    if (d < bestD) {
      best = g;
      bestD = d;
    }
  }
  if (!best) throw new Error(`${spec.key} has no gauge`);
  return best.key;
}
