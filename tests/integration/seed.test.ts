/**
 * The demo seed on a real database: who is who on which farm, what the farms hold, that the boundaries
 * and the weather are believable, and that the scenario depends on the date alone.
 */
import bcrypt from "bcryptjs";
import { area } from "@turf/area";
import type { Polygon, Position } from "geojson";
import knexFactory, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import config from "../../knexfile";
import { IBIS_FLAT, KESTREL_BEND } from "../../seeds/demo/farms";
import { buildDemo } from "../../seeds/demo/scenario";

const TODAY = "2026-12-03";
const YESTERDAY = "2026-12-02";

let knex: Knex;
let seedMs = 0;

/** Every table of the app (not Knex's own bookkeeping), emptied so the seed meets the database it expects. */
async function truncateAll(): Promise<void> {
  const { rows } = await knex.raw<{ rows: { tablename: string }[] }>(
    "select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex\\_%'",
  );
  if (rows.length === 0) return;
  await knex.raw(
    `truncate ${rows.map(() => "??").join(", ")} restart identity cascade`,
    rows.map((r) => r.tablename),
  );
}

beforeAll(async () => {
  knex = knexFactory(config);
  await truncateAll();
  const previous = process.env.ROOTBANK_DEMO_TODAY;
  process.env.ROOTBANK_DEMO_TODAY = TODAY;
  try {
    const started = Date.now();
    await knex.seed.run();
    seedMs = Date.now() - started;
  } finally {
    if (previous === undefined) delete process.env.ROOTBANK_DEMO_TODAY;
    else process.env.ROOTBANK_DEMO_TODAY = previous;
  }
});

afterAll(async () => {
  // Leave the shared test database as other test files expect to find it: without the demo in it.
  await truncateAll();
  await knex.destroy();
});

async function farmId(name: string): Promise<string> {
  const row = await knex("farms").where({ name }).first<{ id: string } | undefined>("id");
  if (!row) throw new Error(`no farm ${name}`);
  return row.id;
}

async function count(query: Knex.QueryBuilder): Promise<number> {
  const row = await query.count<{ n: string | number }[]>({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

async function roles(farm: string): Promise<Record<string, string>> {
  const rows = await knex("memberships as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.farm_id", await farmId(farm))
    .select<{ email: string; role: string }[]>("u.email", "m.role");
  return Object.fromEntries(rows.map((r) => [r.email, r.role]));
}

describe("demo seed", () => {
  it("loads in a few seconds", () => {
    expect(seedMs).toBeGreaterThan(0);
    expect(seedMs).toBeLessThan(10_000);
  });

  it("gives each demo person their role, per farm", async () => {
    expect(await roles("Kestrel Bend")).toEqual({
      "owner@kestrelbend.example": "owner",
      "manager@kestrelbend.example": "manager",
      "agronomist@kestrelbend.example": "agronomist",
      "worker@kestrelbend.example": "worker",
      "viewer@kestrelbend.example": "viewer",
    });
    const ibis = await roles("Ibis Flat");
    expect(ibis["agronomist@kestrelbend.example"]).toBe("agronomist");
    expect(ibis["manager@kestrelbend.example"]).toBe("viewer");
    expect(Object.values(ibis)).toContain("owner");
    expect(ibis["worker@kestrelbend.example"]).toBeUndefined();
  });

  it("signs everyone in with the demo password, hashed at cost 10", async () => {
    const users = await knex("users").select<{ email: string; name: string; password_hash: string }[]>(
      "email",
      "name",
      "password_hash",
    );
    expect(users.length).toBeGreaterThanOrEqual(5);
    for (const u of users) {
      expect(u.password_hash, u.email).toMatch(/^\$2[aby]\$10\$/);
      expect(u.name.length).toBeGreaterThan(0);
    }
    const owner = users.find((u) => u.email === "owner@kestrelbend.example");
    expect(await bcrypt.compare("rootbank-demo", owner?.password_hash ?? "")).toBe(true);
    expect(await bcrypt.compare("wrong", owner?.password_hash ?? "")).toBe(false);
  });

  it("sets up Kestrel Bend's fields, soils, crops, systems, gauges and station", async () => {
    const kb = await farmId("Kestrel Bend");
    const farm = await knex("farms").where({ id: kb }).first();
    expect(farm).toMatchObject({
      time_zone: "Australia/Sydney",
      rain_day_boundary_hour: 9,
      water_year_start_month: 7,
    });
    expect(farm.latitude).toBeCloseTo(-34.45, 1);
    expect(farm.longitude).toBeCloseTo(146.05, 1);

    const fields = await count(knex("fields").where({ farm_id: kb }));
    expect(fields).toBeGreaterThanOrEqual(10);
    expect(fields).toBeLessThanOrEqual(12);
    const areas = await knex("fields").where({ farm_id: kb }).pluck<number[]>("area_ha");
    for (const ha of areas) {
      expect(ha).toBeGreaterThanOrEqual(10);
      expect(ha).toBeLessThanOrEqual(80);
    }
    const planted = await count(
      knex("plantings as p")
        .join("fields as f", "f.id", "p.field_id")
        .where({ "f.farm_id": kb, "p.season": "2026-27" }),
    );
    expect(planted).toBeGreaterThanOrEqual(fields - 2); // most fields are planted...
    expect(planted).toBeLessThan(fields); // ...and at least one lies fallow

    expect(await count(knex("soils").where({ farm_id: kb }))).toBe(3);
    expect(await count(knex("crops").where({ farm_id: kb }))).toBe(4);
    expect(await count(knex("soils").whereNull("farm_id"))).toBeGreaterThanOrEqual(3);
    const libraryCrops = await knex("crops").whereNull("farm_id").pluck<string[]>("name");
    for (const crop of [/maize/i, /cotton/i, /tomato/i, /lucerne|alfalfa/i]) {
      expect(
        libraryCrops.some((n) => crop.test(n)),
        String(crop),
      ).toBe(true);
    }
    for (const s of await knex("soils").where({ farm_id: kb }).pluck<string[]>("source")) {
      expect(s).toMatch(/FAO-56 Table 19.*Rawls, Brakensiek and Miller \(1983\)/);
    }
    for (const c of await knex("crops").where({ farm_id: kb }).pluck<string[]>("source")) {
      expect(c).toMatch(/Table 12.*Table 11.*Table 22/);
    }

    const systems = await knex("irrigation_systems")
      .where({ farm_id: kb })
      .select<{ kind: string; pump_name: string | null }[]>();
    const pivots = systems.filter((s) => s.kind === "pivot");
    expect(pivots.length).toBeGreaterThanOrEqual(2);
    expect(new Set(pivots.map((p) => p.pump_name)).size).toBe(1); // the pivots share one pump
    expect(pivots[0]?.pump_name).toBeTruthy();
    expect(systems.some((s) => s.kind === "drip")).toBe(true);
    expect(systems.some((s) => s.kind === "furrow")).toBe(true);

    const gauges = await knex("gauges")
      .where({ farm_id: kb })
      .select<{ kind: string; resolution_mm: number }[]>();
    expect(gauges.filter((g) => g.kind === "manual")).toHaveLength(2);
    expect(gauges.filter((g) => g.kind === "recording").map((g) => g.resolution_mm)).toEqual([0.2]);
    expect(await count(knex("weather_stations").where({ farm_id: kb }))).toBe(1);
    expect(await count(knex("fields").where({ farm_id: await farmId("Ibis Flat") }))).toBeGreaterThanOrEqual(
      2,
    );
  });

  it("draws every boundary to match its area within 1 %, without overlaps", async () => {
    const fields = await knex("fields").select<
      { name: string; area_ha: number; boundary: Polygon; farm_id: string }[]
    >("name", "area_ha", "boundary", "farm_id");
    for (const f of fields) {
      expect(f.boundary.type, f.name).toBe("Polygon");
      const ha = area(f.boundary) / 10_000;
      expect(Math.abs(ha - f.area_ha) / ha, f.name).toBeLessThan(0.01);
    }
    for (let i = 0; i < fields.length; i++) {
      for (let j = i + 1; j < fields.length; j++) {
        const a = fields[i]!;
        const b = fields[j]!;
        if (a.farm_id !== b.farm_id) continue;
        expect(overlap(a.boundary, b.boundary), `${a.name} / ${b.name}`).toBe(false);
      }
    }
  });

  it("records the season's weather from 1 July to yesterday, plausible for the Riverina", async () => {
    const station = await knex("weather_stations")
      .where({ farm_id: await farmId("Kestrel Bend") })
      .first<{ id: string }>("id");
    const days = await knex("weather_days")
      .where({ station_id: station.id, kind: "observed" })
      .orderBy("date")
      .select<
        {
          date: string;
          tmax_c: number;
          tmin_c: number;
          wind_ms: number | null;
          solar_mj_m2: number | null;
          rain_mm: number;
        }[]
      >();
    expect(days).toHaveLength(155); // 1 July to 2 December 2026
    expect(days[0]?.date).toBe("2026-07-01");
    expect(days.at(-1)?.date).toBe(YESTERDAY);

    const meanTmax = (from: string, to: string) => {
      const sel = days.filter((d) => d.date >= from && d.date <= to);
      return sel.reduce((s, d) => s + d.tmax_c, 0) / sel.length;
    };
    // Winter days in the low to mid teens, early summer near 30 °C (common knowledge of the region, no source).
    expect(meanTmax("2026-07-01", "2026-07-31")).toBeGreaterThan(11);
    expect(meanTmax("2026-07-01", "2026-07-31")).toBeLessThan(18);
    expect(meanTmax("2026-11-03", YESTERDAY)).toBeGreaterThan(25);
    expect(meanTmax("2026-11-03", YESTERDAY)).toBeLessThan(35);
    for (const d of days) {
      if (d.wind_ms !== null) expect(d.wind_ms).toBeGreaterThanOrEqual(1);
      if (d.wind_ms !== null) expect(d.wind_ms).toBeLessThanOrEqual(5);
      // Below the clear-sky bound Rso = (0.75 + 2e-5 z) Ra (FAO-56 eq. 37), z = 130 m.
      if (d.solar_mj_m2 !== null)
        expect(d.solar_mj_m2, d.date).toBeLessThanOrEqual(0.7526 * ra(-34.45, d.date) + 0.05);
    }
    const rainDays = days.filter((d) => d.rain_mm >= 1).length;
    expect(rainDays).toBeGreaterThan(10);
    expect(rainDays).toBeLessThan(60);
    // Some inputs are missing, for the engine to estimate and mark.
    expect(days.some((d) => d.solar_mj_m2 === null)).toBe(true);
  });

  it("books morning gauge readings to the day before, and logs tips of the same storms", async () => {
    const kb = await farmId("Kestrel Bend");
    const readings = await knex("rain_readings as r")
      .join("gauges as g", "g.id", "r.gauge_id")
      .where("g.farm_id", kb)
      .select<{ name: string; rain_date: string; local_read: string; depth_mm: number }[]>(
        "g.name",
        "r.rain_date",
        knex.raw("to_char(r.read_at at time zone 'Australia/Sydney', 'YYYY-MM-DD HH24') as local_read"),
        "r.depth_mm",
      );
    expect(readings.length).toBeGreaterThan(250);
    for (const r of readings) {
      const next = new Date(Date.parse(`${r.rain_date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
      expect(r.local_read.slice(0, 10), r.rain_date).toBe(next);
      expect(["08", "09"]).toContain(r.local_read.slice(11));
      expect(r.rain_date <= YESTERDAY).toBe(true);
    }

    const tips = await knex("rain_records as r")
      .join("gauges as g", "g.id", "r.gauge_id")
      .where({ "g.farm_id": kb, "r.flagged": false })
      .orderBy("r.at")
      .select<{ at: Date; depth_mm: number }[]>("r.at", "r.depth_mm");
    expect(tips.length).toBeGreaterThan(200);
    expect(new Set(tips.map((t) => t.depth_mm))).toEqual(new Set([0.2]));
    // Intense bursts: five tips (1 mm) within two minutes is 30 mm/h or more.
    let burst = false;
    for (let i = 4; i < tips.length; i++) {
      if (new Date(tips[i]!.at).getTime() - new Date(tips[i - 4]!.at).getTime() <= 120_000) burst = true;
    }
    expect(burst).toBe(true);

    // The logger and the manual gauges caught the same storms: season totals agree within a third.
    const manual = readings.filter((r) => r.name === "Homestead gauge").reduce((s, r) => s + r.depth_mm, 0);
    const logged = tips.length * 0.2;
    expect(manual).toBeGreaterThan(100);
    expect(Math.abs(logged - manual) / manual).toBeLessThan(0.33);
    // Quality control has something to show: a flagged tip and a flagged weather day.
    expect(await count(knex("rain_records").where({ flagged: true }))).toBeGreaterThan(0);
    expect(await count(knex("weather_days").where({ flagged: true }))).toBeGreaterThan(0);
  });

  it("logs irrigation by every method and a couple of soil checks", async () => {
    const events = await knex("irrigation_events").select<
      {
        method: string;
        date: string;
        gross_depth_mm: number;
        started_at: Date;
        ended_at: Date;
        created_by: string | null;
      }[]
    >();
    expect(new Set(events.map((e) => e.method))).toEqual(new Set(["depth", "volume", "hours", "meter"]));
    for (const e of events) {
      expect(e.date <= YESTERDAY).toBe(true);
      expect(e.gross_depth_mm).toBeGreaterThan(0);
      expect(new Date(e.ended_at).getTime()).toBeGreaterThan(new Date(e.started_at).getTime());
      expect(e.created_by).not.toBeNull();
    }
    expect(await count(knex("soil_checks"))).toBeGreaterThanOrEqual(2);
  });

  it("refuses to load twice", async () => {
    await expect(knex.seed.run()).rejects.toThrow(/already loaded/);
  });

  it("depends on the date alone: the same day gives the same rows, and a past day keeps its values", () => {
    const farms = [KESTREL_BEND, IBIS_FLAT];
    const now = buildDemo(TODAY, farms);
    expect(JSON.stringify(buildDemo(TODAY, farms))).toBe(JSON.stringify(now));
    const earlier = buildDemo("2026-11-20", farms);
    const upTo = (rows: Record<string, unknown>[], key: string, last: string) =>
      rows.filter((r) => String(r[key]) <= last).map((r) => JSON.stringify(r));
    expect(upTo(earlier.weather_days, "date", "2026-11-19")).toEqual(
      upTo(now.weather_days, "date", "2026-11-19"),
    );
    expect(upTo(earlier.rain_readings, "rain_date", "2026-11-19")).toEqual(
      upTo(now.rain_readings, "rain_date", "2026-11-19"),
    );
    expect(earlier.weather_days.length).toBeGreaterThan(200);
  });
});

/** Extraterrestrial radiation, MJ m-2 day-1 (FAO-56 eq. 21-25). */
function ra(latitudeDeg: number, date: string): number {
  const j =
    Math.round(
      (Date.parse(`${date}T00:00:00Z`) - Date.parse(`${date.slice(0, 4)}-01-01T00:00:00Z`)) / 86_400_000,
    ) + 1;
  const phi = (latitudeDeg * Math.PI) / 180;
  const dr = 1 + 0.033 * Math.cos((2 * Math.PI * j) / 365);
  const d = 0.409 * Math.sin((2 * Math.PI * j) / 365 - 1.39);
  const ws = Math.acos(-Math.tan(phi) * Math.tan(d));
  return (
    ((24 * 60) / Math.PI) *
    0.082 *
    dr *
    (ws * Math.sin(phi) * Math.sin(d) + Math.cos(phi) * Math.cos(d) * Math.sin(ws))
  );
}

describe("the test's own Ra", () => {
  it("matches FAO-56 Example 8 (20°S, 3 September: 32.2 MJ m-2 day-1)", () => {
    expect(ra(-20, "2026-09-03")).toBeCloseTo(32.2, 1);
  });
});

/** Whether two simple polygons share any interior: an edge crossing, or one inside the other. */
function overlap(a: Polygon, b: Polygon): boolean {
  const ringA = a.coordinates[0]!;
  const ringB = b.coordinates[0]!;
  for (let i = 0; i + 1 < ringA.length; i++) {
    for (let j = 0; j + 1 < ringB.length; j++) {
      if (segmentsCross(ringA[i]!, ringA[i + 1]!, ringB[j]!, ringB[j + 1]!)) return true;
    }
  }
  return inside(ringA[0]!, ringB) || inside(ringB[0]!, ringA);
}

function segmentsCross(p: Position, q: Position, r: Position, s: Position): boolean {
  const cross = (o: Position, x: Position, y: Position) =>
    (x[0]! - o[0]!) * (y[1]! - o[1]!) - (x[1]! - o[1]!) * (y[0]! - o[0]!);
  const d1 = cross(r, s, p);
  const d2 = cross(r, s, q);
  const d3 = cross(p, q, r);
  const d4 = cross(p, q, s);
  return d1 * d2 < 0 && d3 * d4 < 0;
}

function inside(pt: Position, ring: Position[]): boolean {
  let c = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i]!;
    const b = ring[j]!;
    if (
      a[1]! > pt[1]! !== b[1]! > pt[1]! &&
      pt[0]! < ((b[0]! - a[0]!) * (pt[1]! - a[1]!)) / (b[1]! - a[1]!) + a[0]!
    )
      c = !c;
  }
  return c;
}
