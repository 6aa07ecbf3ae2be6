/**
 * The benchmarks' farm: 2,000 fields on a grid a few kilometres across, one weather station, eight manual
 * gauges read daily, twenty systems on ten pumps, a year of weather and rain, irrigations and soil checks.
 * Every value comes from the day and field index (no randomness), so each run sees the same farm; it is
 * invented bench data, created in a fresh farm and removed afterwards.
 */
import { db } from "@/db/knex";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";

export const BENCH_FIELDS = Number(process.env.BENCH_FIELDS ?? 2000);
export const BENCH_DAYS = 365;
const TZ = "Australia/Sydney";
const ORIGIN = { lat: -34.4, lon: 146.0 };
const GAUGE_GRID = 4;

async function insertChunks(table: string, rows: Record<string, unknown>[], returning?: string): Promise<Record<string, unknown>[]> {
  const out: Record<string, unknown>[] = [];
  for (let k = 0; k < rows.length; k += 2000) {
    const q = db(table).insert(rows.slice(k, k + 2000));
    if (returning) out.push(...((await q.returning(returning)) as Record<string, unknown>[]));
    else await q;
  }
  return out;
}

export interface BenchFarm {
  farmId: string;
  userId: string;
  user: { id: string; email: string; name: string };
  today: string;
  remove: () => Promise<void>;
}

export async function createBenchFarm(label: string): Promise<BenchFarm> {
  const today = farmToday(TZ);
  const start = addDaysIso(today, -BENCH_DAYS);
  const stamp = `${label}-${Date.now()}`;
  const [farm] = (await db("farms")
    .insert({ name: `Bench ${stamp}`, time_zone: TZ, latitude: ORIGIN.lat, longitude: ORIGIN.lon, elevation_m: 120 })
    .returning("id")) as { id: string }[];
  const farmId = farm!.id;
  const [user] = (await db("users").insert({ email: `bench-${stamp}@bench.rootbank.example`, name: "Bench viewer" }).returning(["id", "email", "name"])) as { id: string; email: string; name: string }[];
  await db("memberships").insert({ user_id: user!.id, farm_id: farmId, role: "viewer" });

  const soils = (await insertChunks("soils", [
    { farm_id: farmId, name: "Bench loam", texture: "loam", theta_fc: 0.3, theta_wp: 0.14, theta_sat: 0.46, hydrologic_group: "B" },
    { farm_id: farmId, name: "Bench clay loam", texture: "clay-loam", theta_fc: 0.32, theta_wp: 0.2, theta_sat: 0.46, hydrologic_group: "C" },
    { farm_id: farmId, name: "Bench sandy loam", texture: "sandy-loam", theta_fc: 0.23, theta_wp: 0.1, theta_sat: 0.45, hydrologic_group: "B" },
  ], "id")).map((r) => String(r.id));
  // FAO-56 Table 12 / 11 / 22 maize (grain) values.
  const [crop] = (await db("crops").insert({
    farm_id: farmId, name: "Bench maize", kc_ini: 0.3, kc_mid: 1.2, kc_end: 0.35, stage_ini_days: 30, stage_dev_days: 40,
    stage_mid_days: 50, stage_late_days: 30, height_m: 2, root_min_m: 0.3, root_max_m: 1.2, p: 0.55, runoff_cover: "row-crop-straight-good",
  }).returning("id")) as { id: string }[];
  const [station] = (await db("weather_stations").insert({ farm_id: farmId, name: "Bench station", latitude: ORIGIN.lat - 0.01, longitude: ORIGIN.lon + 0.01, elevation_m: 120 }).returning("id")) as { id: string }[];
  const gauges: { id: string; row: number; col: number }[] = [];
  for (let r = 0; r < GAUGE_GRID / 2; r++) {
    for (let c = 0; c < GAUGE_GRID; c++) {
      const [g] = (await db("gauges").insert({ farm_id: farmId, name: `G${r}${c}`, kind: "manual", latitude: ORIGIN.lat - r * 0.02, longitude: ORIGIN.lon + c * 0.015 }).returning("id")) as { id: string }[];
      gauges.push({ id: g!.id, row: r, col: c });
    }
  }
  const systems = (await insertChunks("irrigation_systems", Array.from({ length: 20 }, (_, k) => ({
    farm_id: farmId, name: `System ${k}`, kind: k % 2 ? "pivot" : "drip", application_efficiency: k % 2 ? 0.85 : 0.9,
    flow_m3_h: 150 + 10 * k, pump_name: `Pump ${Math.floor(k / 2)}`,
  })), "id")).map((r) => String(r.id));

  const weather = [];
  for (let i = 0; i < BENCH_DAYS; i++) {
    const season = Math.cos(((i - 200) / 365) * 2 * Math.PI);
    weather.push({
      station_id: station!.id, date: addDaysIso(start, i), kind: "observed",
      tmax_c: 24 + 8 * season + 3 * Math.sin(i / 4), tmin_c: 10 + 6 * season + 2 * Math.cos(i / 5), rh_max_pct: 85, rh_min_pct: 38 + 10 * Math.sin(i / 3),
      wind_ms: 2.3 + Math.sin(i / 6), solar_mj_m2: i % 17 === 0 ? null : 20 + 8 * season,
    });
  }
  await insertChunks("weather_days", weather);
  const readings = [];
  for (const g of gauges) {
    for (let i = 0; i < BENCH_DAYS; i++) {
      const wet = (i + g.col) % 6 === 0;
      const date = addDaysIso(start, i);
      readings.push({ gauge_id: g.id, rain_date: date, read_at: `${addDaysIso(date, 1)}T09:00:00+10:00`, depth_mm: wet ? 4 + ((i * 7 + g.row * 3) % 25) : 0 });
    }
  }
  await insertChunks("rain_readings", readings);

  const cols = 50;
  const fields = Array.from({ length: BENCH_FIELDS }, (_, k) => {
    const r = Math.floor(k / cols);
    const c = k % cols;
    const own = k % 10 === 0 ? gauges[k % gauges.length]!.id : null;
    return {
      farm_id: farmId, name: `Field ${String(k).padStart(4, "0")}`, area_ha: 10 + (k % 50), centroid_lat: ORIGIN.lat - r * 0.001, centroid_lon: ORIGIN.lon + c * 0.0012,
      soil_id: soils[k % 3], slope_pct: k % 7, irrigation_system_id: systems[k % systems.length], gauge_id: own,
    };
  });
  const fieldIds = (await insertChunks("fields", fields, "id")).map((r) => String(r.id));
  await insertChunks("plantings", fieldIds.map((id, k) => ({
    field_id: id, season: "bench", crop_id: crop!.id, planting_date: addDaysIso(start, 20 + (k % 40)), climate_adjust: true,
    initial_depletion_mm: k % 15, ...(k % 4 === 0 ? { mad: 0.45 } : {}),
  })));
  const events = [];
  const checks = [];
  for (let k = 0; k < fieldIds.length; k++) {
    for (let i = 40 + (k % 9); i < BENCH_DAYS; i += 9) {
      const date = addDaysIso(start, i);
      events.push({ field_id: fieldIds[k], started_at: `${date}T06:00:00+10:00`, date, gross_depth_mm: 20 + (k % 10), method: "depth" });
    }
    checks.push({ field_id: fieldIds[k], date: addDaysIso(start, 120 + (k % 30)), depletion_mm: 20 + (k % 20), method: "probe" });
  }
  await insertChunks("irrigation_events", events);
  await insertChunks("soil_checks", checks);

  return {
    farmId,
    userId: user!.id,
    user: user!,
    today,
    remove: async () => {
      // Account days and observations go with their fields; soils and crops are referenced without cascade.
      await db("fields").where({ farm_id: farmId }).delete();
      await db("farms").where({ id: farmId }).delete();
      await db("users").where({ id: user!.id }).delete();
    },
  };
}
