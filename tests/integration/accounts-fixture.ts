import { TZDate } from "@date-fns/tz";
import { db } from "@/db/knex";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

/**
 * A small farm for the account tests: one station, two manual gauges and a tipping bucket, three
 * systems (two on one pump), three fields (own manual gauge; no gauge, so inverse-distance rain; own
 * tipping bucket, so Green-Ampt), 60 days of weather and rain. All values are invented fixture data.
 */

export const TZ = "Australia/Sydney";
export const SPAN_DAYS = 60;
export const STATION = { latitude: -34.41, longitude: 146.01, elevation_m: 120 };
export const GAUGES = {
  g1: { latitude: -34.4, longitude: 146.0 },
  g2: { latitude: -34.42, longitude: 146.03 },
  g3: { latitude: -34.39, longitude: 145.99 },
};
export const FIELDS = {
  a: { centroid_lat: -34.401, centroid_lon: 146.001, area_ha: 40, slope_pct: 2 },
  b: { centroid_lat: -34.41, centroid_lon: 146.015, area_ha: 25, slope_pct: null },
  c: { centroid_lat: -34.391, centroid_lon: 145.991, area_ha: 12, slope_pct: null },
};
/** Fixture crop: FAO-56 Table 12 maize coefficients with stages shortened so all four fall in 60 days. */
export const CROP = { kc_ini: 0.3, kc_mid: 1.2, kc_end: 0.35, stages: [10, 15, 20, 15] as const, root_min_m: 0.3, root_max_m: 1.2, p: 0.55 };
export const SOIL = { texture: "loam", theta_fc: 0.3, theta_wp: 0.14, theta_sat: 0.46, hydrologic_group: "B" };
/** Rain days of the manual gauges: day index → depth, mm. */
export const G1_RAIN: Record<number, number> = { 5: 12.4, 17: 30.2, 33: 6, 48: 22 };
export const G2_RAIN: Record<number, number> = { 5: 10, 17: 26, 33: 0, 40: 5, 48: 18 };
/** Days the tipping bucket tips 0.2 mm every 72 s from 14:00 local: day → tips. */
export const G3_TIPS: Record<number, number> = { 17: 100, 48: 60 };
export const FLAGGED_WEATHER_DAY = 12;

export interface AccountFarm {
  team: FarmTeam;
  farmId: string;
  today: string;
  start: string;
  yesterday: string;
  ids: { soil: string; crop: string; station: string; g1: string; g2: string; g3: string; s1: string; s2: string; s3: string; a: string; b: string; c: string; pa: string; pb: string; pc: string };
}

export function dayDate(start: string, i: number): string {
  return addDaysIso(start, i);
}

/** Raw weather of day `i` (solar left out every 10th day, so FAO-56 ch. 3 estimates it). */
export function weatherOf(i: number) {
  return {
    tmax_c: 27 + 4 * Math.sin(i / 5),
    tmin_c: 13 + 2 * Math.cos(i / 7),
    rh_max_pct: 88,
    rh_min_pct: 35 + 10 * Math.sin(i / 3),
    wind_ms: 2.2 + 0.8 * Math.sin(i / 4),
    solar_mj_m2: i % 10 === 3 ? null : 24 + 3 * Math.sin(i / 6),
  };
}

/** Instants (epoch ms) of the bucket's tips on day `i`. */
export function tipInstants(start: string, i: number): number[] {
  const [y, m, d] = dayDate(start, i).split("-").map(Number) as [number, number, number];
  const t0 = new TZDate(y, m - 1, d, 14, 0, 0, TZ).getTime();
  return Array.from({ length: G3_TIPS[i] ?? 0 }, (_, k) => t0 + k * 72_000);
}

export async function createAccountFarm(): Promise<AccountFarm> {
  const team = await createFarmTeam();
  const farmId = team.farmId;
  const today = farmToday(TZ);
  const start = addDaysIso(today, -SPAN_DAYS);
  const one = async (table: string, row: Record<string, unknown>): Promise<string> => ((await db(table).insert(row).returning("id")) as { id: string }[])[0]!.id;
  await db("farms").where({ id: farmId }).update({ time_zone: TZ, rain_day_boundary_hour: 9, elevation_m: 120 });
  const soil = await one("soils", { farm_id: farmId, name: "Fixture loam", ...SOIL });
  const [ini, dev, mid, late] = CROP.stages;
  const crop = await one("crops", {
    farm_id: farmId, name: "Fixture maize", kc_ini: CROP.kc_ini, kc_mid: CROP.kc_mid, kc_end: CROP.kc_end,
    stage_ini_days: ini, stage_dev_days: dev, stage_mid_days: mid, stage_late_days: late, height_m: 2,
    root_min_m: CROP.root_min_m, root_max_m: CROP.root_max_m, p: CROP.p, runoff_cover: "row-crop-straight-good",
  });
  const station = await one("weather_stations", { farm_id: farmId, name: "Fixture station", ...STATION, wind_height_m: 2 });
  const g1 = await one("gauges", { farm_id: farmId, name: "G1", kind: "manual", ...GAUGES.g1 });
  const g2 = await one("gauges", { farm_id: farmId, name: "G2", kind: "manual", ...GAUGES.g2 });
  const g3 = await one("gauges", { farm_id: farmId, name: "G3", kind: "recording", resolution_mm: 0.2, ...GAUGES.g3 });
  const s1 = await one("irrigation_systems", { farm_id: farmId, name: "Pivot", kind: "pivot", application_efficiency: 0.85, flow_m3_h: 250, pump_name: "North pump" });
  const s2 = await one("irrigation_systems", { farm_id: farmId, name: "Drip", kind: "drip", application_efficiency: 0.9, flow_m3_h: 120, pump_name: "North pump" });
  const s3 = await one("irrigation_systems", { farm_id: farmId, name: "Sprinklers", kind: "solid_set", application_efficiency: 0.7, capacity_mm_day: 8 });
  const field = (name: string, f: (typeof FIELDS)["a"] | (typeof FIELDS)["b"], system: string, gauge: string | null) =>
    one("fields", { farm_id: farmId, name, ...f, soil_id: soil, irrigation_system_id: system, gauge_id: gauge, account_dirty_from: start });
  const a = await field("A own gauge", FIELDS.a, s1, g1);
  const b = await field("B nearby gauges", FIELDS.b, s2, null);
  const c = await field("C tipping bucket", FIELDS.c, s3, g3);
  const planting = (fieldId: string, extra: Record<string, unknown>) =>
    one("plantings", { field_id: fieldId, season: "fixture", crop_id: crop, planting_date: start, climate_adjust: true, ...extra });
  const pa = await planting(a, { initial_depletion_mm: 10 });
  const pb = await planting(b, { initial_depletion_mm: 0, mad: 0.4 });
  const pc = await planting(c, { initial_depletion_mm: 20 });

  const weather = [];
  for (let i = 0; i < SPAN_DAYS; i++) {
    weather.push({ station_id: station, date: dayDate(start, i), kind: "observed", ...weatherOf(i), flagged: i === FLAGGED_WEATHER_DAY });
  }
  for (let i = SPAN_DAYS; i < SPAN_DAYS + 5; i++) {
    weather.push({ station_id: station, date: dayDate(start, i), kind: "forecast", ...weatherOf(i), eto_mm: 6 });
  }
  await db("weather_days").insert(weather);
  const readings = [];
  for (let i = 0; i < SPAN_DAYS; i++) {
    const date = dayDate(start, i);
    const readAt = `${addDaysIso(date, 1)}T09:00:00+11:00`;
    readings.push({ gauge_id: g1, rain_date: date, read_at: readAt, depth_mm: G1_RAIN[i] ?? 0 });
    if (G2_RAIN[i] !== undefined) readings.push({ gauge_id: g2, rain_date: date, read_at: readAt, depth_mm: G2_RAIN[i] });
  }
  await db("rain_readings").insert(readings);
  const tips = Object.keys(G3_TIPS).flatMap((k) => tipInstants(start, Number(k)).map((ms) => ({ gauge_id: g3, at: new Date(ms), depth_mm: 0.2 })));
  await db("rain_records").insert(tips);
  await db("irrigation_events").insert([
    { field_id: a, system_id: s1, started_at: `${dayDate(start, 25)}T06:00:00+11:00`, date: dayDate(start, 25), gross_depth_mm: 25, method: "depth" },
    { field_id: b, system_id: s2, started_at: `${dayDate(start, 30)}T06:00:00+11:00`, date: dayDate(start, 30), gross_depth_mm: 22, net_depth_mm: 20, method: "depth" },
    { field_id: c, system_id: s3, started_at: `${dayDate(start, 20)}T06:00:00+11:00`, date: dayDate(start, 20), gross_depth_mm: 30, method: "depth" },
  ]);
  await db("soil_checks").insert({ field_id: b, date: dayDate(start, 40), depletion_mm: 35, method: "probe" });
  return {
    team, farmId, today, start, yesterday: addDaysIso(today, -1),
    ids: { soil, crop, station, g1, g2, g3, s1, s2, s3, a, b, c, pa, pb, pc },
  };
}
