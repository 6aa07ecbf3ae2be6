/**
 * The farm map page: first-load JavaScript (gzip) and the time until a 500-field map is drawn and clickable.
 * Run: `npm run bench` (test database, built app), or by hand after `next build`:
 *   DATABASE_URL=<test database> NEXTAUTH_SECRET=… node --conditions=react-server --import tsx tests/bench/map-page.bench.ts
 * It creates a 500-field farm (invented bench data) with a manager, starts `next start` on a free port,
 * signs in with Chromium, measures, and removes the farm and stops the server afterwards.
 * Targets: first-load JS ≤ 250 KB gzip; the map interactive well within a few seconds (reported, not enforced).
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync } from "node:fs";
import { createServer } from "node:net";
import { gzipSync } from "node:zlib";
import bcrypt from "bcryptjs";
import { chromium } from "playwright-core";
import { db } from "@/db/knex";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";

const FIELDS = 500;
const COLS = 25;
const TZ = "Australia/Sydney";
const ORIGIN = { lat: -34.5, lon: 146.2 };
/** Square fields of about 400 m, 40 m of track between them. */
const CELL_DEG = { lat: 0.004, lon: 0.0048 };
const SIDE_DEG = { lat: 0.0036, lon: 0.0044 };
const WEATHER_DAYS = 40;
const JS_TARGET_KB = 250;
const PASSWORD = "bench-map-password";

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.listen(0, "127.0.0.1", () => {
      const address = s.address();
      const port = typeof address === "object" && address ? address.port : 0;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });
}

async function createMapFarm() {
  const stamp = `map-${Date.now()}`;
  const today = farmToday(TZ);
  const [farm] = (await db("farms").insert({ name: `Bench ${stamp}`, time_zone: TZ, latitude: ORIGIN.lat, longitude: ORIGIN.lon, elevation_m: 120 }).returning("id")) as { id: string }[];
  const farmId = farm!.id;
  const email = `bench-${stamp}@bench.rootbank.example`;
  const [user] = (await db("users").insert({ email, name: "Bench manager", password_hash: await bcrypt.hash(PASSWORD, 10) }).returning("id")) as { id: string }[];
  await db("memberships").insert({ user_id: user!.id, farm_id: farmId, role: "manager" });
  const [soil] = (await db("soils").insert({ farm_id: farmId, name: "Bench loam", texture: "loam", theta_fc: 0.3, theta_wp: 0.14, theta_sat: 0.46, hydrologic_group: "B" }).returning("id")) as { id: string }[];
  // FAO-56 Table 12 / 11 / 22 maize (grain) values.
  const [crop] = (await db("crops").insert({
    farm_id: farmId, name: "Bench maize", kc_ini: 0.3, kc_mid: 1.2, kc_end: 0.35, stage_ini_days: 30, stage_dev_days: 40,
    stage_mid_days: 50, stage_late_days: 30, height_m: 2, root_min_m: 0.3, root_max_m: 1.2, p: 0.55, runoff_cover: "row-crop-straight-good",
  }).returning("id")) as { id: string }[];
  const [station] = (await db("weather_stations").insert({ farm_id: farmId, name: "Bench station", latitude: ORIGIN.lat + 0.01, longitude: ORIGIN.lon - 0.01, elevation_m: 120 }).returning("id")) as { id: string }[];
  const [gauge] = (await db("gauges").insert({ farm_id: farmId, name: "Bench gauge", kind: "manual", latitude: ORIGIN.lat - 0.02, longitude: ORIGIN.lon + 0.05 }).returning("id")) as { id: string }[];
  const start = addDaysIso(today, -WEATHER_DAYS);
  await db("weather_days").insert(
    Array.from({ length: WEATHER_DAYS }, (_, i) => ({
      station_id: station!.id, date: addDaysIso(start, i), kind: "observed", tmax_c: 29 + 3 * Math.sin(i / 4), tmin_c: 14 + 2 * Math.cos(i / 5),
      rh_max_pct: 82, rh_min_pct: 35, wind_ms: 2.4, solar_mj_m2: 26,
    })),
  );
  await db("rain_readings").insert(
    Array.from({ length: WEATHER_DAYS }, (_, i) => ({ gauge_id: gauge!.id, rain_date: addDaysIso(start, i), read_at: `${addDaysIso(start, i + 1)}T09:00:00+11:00`, depth_mm: i % 9 === 0 ? 12 : 0 })),
  );
  const fields = Array.from({ length: FIELDS }, (_, k) => {
    const south = ORIGIN.lat - Math.floor(k / COLS) * CELL_DEG.lat;
    const west = ORIGIN.lon + (k % COLS) * CELL_DEG.lon;
    const ring = [[west, south], [west + SIDE_DEG.lon, south], [west + SIDE_DEG.lon, south + SIDE_DEG.lat], [west, south + SIDE_DEG.lat], [west, south]];
    return {
      farm_id: farmId, name: `Block ${String(k + 1).padStart(3, "0")}`, area_ha: 16, soil_id: soil!.id,
      boundary: JSON.stringify({ type: "Polygon", coordinates: [ring] }), centroid_lat: south + SIDE_DEG.lat / 2, centroid_lon: west + SIDE_DEG.lon / 2,
    };
  });
  const ids: string[] = [];
  for (let k = 0; k < fields.length; k += 250) ids.push(...((await db("fields").insert(fields.slice(k, k + 250)).returning("id")) as { id: string }[]).map((r) => r.id));
  // Different starting depletions spread the fields over the bands.
  await db("plantings").insert(ids.map((id, k) => ({ field_id: id, season: "bench", crop_id: crop!.id, planting_date: addDaysIso(start, -60), initial_depletion_mm: (k * 7) % 90 })));
  await recomputeFarm(farmId, { all: true, today });
  return {
    farmId,
    email,
    remove: async () => {
      await db("fields").where({ farm_id: farmId }).delete();
      await db("farms").where({ id: farmId }).delete();
      await db("users").where({ id: user!.id }).delete();
    },
  };
}

async function startServer(port: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, ["node_modules/next/dist/bin/next", "start", "-p", String(port)], {
    env: { ...process.env, NODE_ENV: "production", NEXTAUTH_URL: `http://localhost:${port}`, PORT: String(port) },
    stdio: ["ignore", "ignore", "inherit"],
  });
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(`http://localhost:${port}/api/health`)).ok) return child;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  child.kill();
  throw new Error("next start did not answer within 60 s");
}

async function measure(base: string, farmId: string, email: string): Promise<{ jsKb: number; jsFiles: number; interactiveMs: number; polygons: number }> {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  try {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    page.setDefaultTimeout(60_000);
    await page.goto(`${base}/sign-in`);
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill(PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/farms(\/|$)/);
    // A fresh tab with an empty cache, as a first visit: every chunk is fetched once.
    const fresh = await context.newPage();
    await page.close();
    const scripts = new Set<string>();
    fresh.on("response", (res) => {
      if (res.request().resourceType() === "script") scripts.add(res.url());
    });
    const t0 = Date.now();
    await fresh.goto(`${base}/farms/${farmId}`);
    await fresh.waitForFunction((n) => document.querySelectorAll("path.rb-field.leaflet-interactive").length >= n, FIELDS, { timeout: 120_000 });
    const interactiveMs = Date.now() - t0;
    const polygons = await fresh.locator("path.rb-field").count();
    // Clickable: a tap on a polygon opens its field sheet.
    await fresh.locator("path.rb-field").nth(Math.floor(FIELDS / 2)).click();
    await fresh.waitForURL(/\/fields\/[0-9a-f-]{36}$/);
    let bytes = 0;
    for (const url of scripts) bytes += gzipSync(Buffer.from(await (await fetch(url)).arrayBuffer()), { level: 9 }).length;
    return { jsKb: bytes / 1024, jsFiles: scripts.size, interactiveMs, polygons };
  } finally {
    await browser.close();
  }
}

async function main(): Promise<void> {
  if (!existsSync(".next/BUILD_ID")) throw new Error("map-page bench: build the app first (next build); it measures the production bundle");
  const t0 = performance.now();
  const farm = await createMapFarm();
  console.log(`bench farm: ${FIELDS} fields with boundaries, accounts computed, in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  const port = await freePort();
  let server: ChildProcess | undefined;
  let ok = true;
  try {
    server = await startServer(port);
    const r = await measure(`http://localhost:${port}`, farm.farmId, farm.email);
    const jsOk = r.jsKb <= JS_TARGET_KB;
    ok = jsOk;
    console.log(`map page first-load JavaScript: ${r.jsKb.toFixed(1)} KB gzip in ${r.jsFiles} chunks (map chunk included) — target ≤ ${JS_TARGET_KB} KB: ${jsOk ? "met" : "NOT met"}`);
    console.log(`map page with ${r.polygons} fields: drawn and clickable ${(r.interactiveMs / 1000).toFixed(2)} s after navigation`);
  } finally {
    server?.kill();
    await farm.remove();
    await db.destroy();
  }
  console.log(ok ? "map page: all targets met" : "map page: a target was missed");
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
