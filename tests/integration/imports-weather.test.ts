/**
 * Weather station files: the column mapping and units chosen by the user, daily and hourly files,
 * rejected rows reported by line and column, all-or-nothing, repeat imports and the size limit.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import * as importsRoute from "@/app/api/v1/farms/[farmId]/imports/route";
import * as importRoute from "@/app/api/v1/farms/[farmId]/imports/[importId]/route";
import { queue } from "@/lib/jobs/queue";
import { toCelsius, toMetresPerSecond, toMillimetres, toSolarMJm2 } from "@/lib/imports/units";
import { readCsv } from "@/lib/imports/csv";
import { weatherOptionsSchema } from "@/lib/imports/options";
import { parseWeather } from "@/lib/imports/weather";
import { call } from "../helpers/api";
import { createFarm, createFarmTeam, type FarmTeam } from "../helpers/fixtures";
import { fixture, upload } from "../fixtures/imports/upload";

interface ImportBody {
  id: string;
  status: string;
  progress: number;
  repeat: boolean;
  counts: {
    rows: number;
    accepted: number;
    rejected: number;
    inserted: number;
    updated: number;
    unchanged: number;
  };
  report: {
    rejected: { line: number; column: string; reason: string }[];
    warnings: string[];
    written: boolean;
  };
  error?: { code: string; fields?: Record<string, string> };
}

let team: FarmTeam;
let stationId: string;
let otherStationId: string;

async function station(farmId: string, name: string): Promise<string> {
  const [row] = await db("weather_stations")
    .insert({ farm_id: farmId, name, latitude: -34.4, longitude: 146.0, elevation_m: 120 })
    .returning("id");
  return row.id;
}

const days = (id: string) => db("weather_days").where({ station_id: id, kind: "observed" }).orderBy("date");

beforeAll(async () => {
  team = await createFarmTeam();
  stationId = await station(team.farmId, "Home station");
  otherStationId = await station(await createFarm("Elsewhere"), "Their station");
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

describe("unit conversions", () => {
  it("converts by the units' definitions", () => {
    // 1 mph = 0.44704 m/s, 1 in = 25.4 mm, 1 knot = 1852 m/h: exact by definition (international yard
    // and pound agreement 1959; international nautical mile 1929).
    expect(toMetresPerSecond(1, "mph")).toBe(0.44704);
    expect(toMillimetres(1, "in")).toBe(25.4);
    expect(toMetresPerSecond(1, "knots")).toBeCloseTo(0.514444, 6);
    expect(toMetresPerSecond(36, "km/h")).toBeCloseTo(10, 12);
    // 212 °F and 32 °F are water's boiling and freezing points (the scale's definition).
    expect(toCelsius(212, "F")).toBeCloseTo(100, 12);
    expect(toCelsius(32, "F")).toBe(0);
    // 1 W/m² over a day is 0.0864 MJ/m², over an hour 0.0036 MJ/m² (FAO-56 ch. 3, conversion factors).
    expect(toSolarMJm2(1, "W/m2", 86_400)).toBeCloseTo(0.0864, 12);
    expect(toSolarMJm2(1, "W/m2", 3_600)).toBeCloseTo(0.0036, 12);
  });
});

describe("daily weather files", () => {
  const imperial = {
    stationId: "",
    columns: {
      date: "Day",
      tmax: "High F",
      tmin: "Low F",
      rhMax: "RH max",
      rhMin: "RH min",
      wind: "Wind mph",
      solar: "Solar W/m2",
      rain: "Rain in",
    },
    units: { temperature: "F", wind: "mph", solar: "W/m2", rain: "in" },
  };

  it("stores days in the engine's units, from the user's mapping and units", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "imperial.csv", data: fixture("weather-daily-imperial.csv") },
      "weather_csv",
      { ...imperial, stationId },
    );
    expect(res.status).toBe(201);
    expect(res.body.status).toBe("done");
    expect(res.body.counts).toMatchObject({ rows: 3, accepted: 3, rejected: 0, inserted: 3 });
    const rows = await days(stationId);
    expect(rows.map((r) => r.date)).toEqual(["2026-11-02", "2026-11-03", "2026-11-04"]);
    // by hand: (86 − 32) × 5/9 = 30; (59 − 32) × 5/9 = 15; 5 mph × 0.44704 = 2.2352 m/s;
    // 300 W/m² × 0.0864 = 25.92 MJ/m²; 0.5 in × 25.4 = 12.7 mm
    expect(rows[0]).toMatchObject({
      tmax_c: 30,
      tmin_c: 15,
      rh_max_pct: 82,
      rh_min_pct: 31,
      rain_mm: 0,
      flagged: false,
    });
    expect(rows[0].wind_ms).toBeCloseTo(2.2352, 10);
    expect(rows[0].solar_mj_m2).toBeCloseTo(25.92, 10);
    expect(rows[1].tmax_c).toBeCloseTo(33, 10);
    expect(rows[1].tmin_c).toBeCloseTo(18, 10);
    expect(rows[1].rain_mm).toBeCloseTo(12.7, 10);
    expect(rows[2].rain_mm).toBeCloseTo(31.75, 10);
    // the import is audited, and the farm's accounts are marked for a recompute from the first day
    const entry = await db("audit_log").where({ entity: "import", entity_id: res.body.id }).first();
    expect(entry).toMatchObject({ farm_id: team.farmId, user_id: team.worker.id, action: "import" });
  });

  it("changes nothing when the same file is imported again", async () => {
    const before = await days(stationId);
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "imperial.csv", data: fixture("weather-daily-imperial.csv") },
      "weather_csv",
      { ...imperial, stationId },
    );
    expect(res.status).toBe(200);
    expect(res.body.repeat).toBe(true);
    const after = await days(stationId);
    expect(after.map((r) => [r.id, r.updated_at.getTime()])).toEqual(
      before.map((r) => [r.id, r.updated_at.getTime()]),
    );
  });

  it("does not duplicate or touch rows when a renamed copy is imported (upserts by day)", async () => {
    const before = await days(stationId);
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "copy.csv", data: fixture("weather-daily-imperial.csv").toString() + "\n" },
      "weather_csv",
      { ...imperial, stationId },
    );
    expect(res.status).toBe(201);
    expect(res.body.counts).toMatchObject({ inserted: 0, updated: 0, unchanged: 3 });
    const after = await days(stationId);
    expect(after.map((r) => [r.id, r.updated_at.getTime()])).toEqual(
      before.map((r) => [r.id, r.updated_at.getTime()]),
    );
  });

  const plain = {
    columns: {
      date: "date",
      tmax: "tmax",
      tmin: "tmin",
      rhMax: "rhmax",
      rhMin: "rhmin",
      wind: "wind",
      solar: "solar",
      rain: "rain",
    },
  };

  it("reports every rejected row by line, column and reason, and writes nothing by default", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "broken.csv", data: fixture("weather-daily-broken.csv") },
      "weather_csv",
      { ...plain, stationId },
    );
    expect(res.status).toBe(201);
    expect(res.body.status).toBe("rejected");
    expect(res.body.report.written).toBe(false);
    expect(res.body.counts).toMatchObject({ rows: 8, rejected: 6, inserted: 0 });
    const byLine = Object.fromEntries(res.body.report.rejected.map((p) => [p.line, p]));
    expect(byLine[4]).toMatchObject({ column: "date", reason: "not a date in ymd order" });
    expect(byLine[5]).toMatchObject({ column: "tmax", reason: "not a number" });
    expect(byLine[6]).toMatchObject({ column: "tmin", reason: "minimum temperature above the maximum" });
    expect(byLine[7]).toMatchObject({ column: "rhmax" });
    expect(byLine[8]).toMatchObject({ column: "date", reason: "the same date as line 3" });
    expect(byLine[9]).toMatchObject({ column: "solar" });
    expect(
      await db("weather_days")
        .where({ station_id: stationId })
        .whereBetween("date", ["2026-11-10", "2026-11-16"]),
    ).toHaveLength(0);
  });

  it("writes the good rows when asked to", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.manager,
      { name: "broken.csv", data: fixture("weather-daily-broken.csv") },
      "weather_csv",
      { ...plain, stationId, writeGoodRows: true },
    );
    expect(res.body.status).toBe("done");
    expect(res.body.counts).toMatchObject({ rejected: 6, inserted: 2 });
    const stored = await db("weather_days")
      .where({ station_id: stationId })
      .whereBetween("date", ["2026-11-10", "2026-11-16"])
      .orderBy("date");
    expect(stored.map((r) => r.date)).toEqual(["2026-11-10", "2026-11-11"]);
    expect(stored[1].tmax_c).toBe(31); // line 3, not its duplicate on line 8
  });
});

describe("hourly weather files", () => {
  it("aggregates to the local day as FAO-56 ch. 3 builds daily values", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.agronomist,
      { name: "hourly.csv", data: fixture("weather-hourly.csv") },
      "weather_csv",
      {
        stationId,
        interval: "hourly",
        columns: {
          date: "timestamp",
          temp: "temp_c",
          rh: "rh_pct",
          wind: "wind_kmh",
          solar: "solar_wm2",
          rain: "rain_mm",
        },
        units: { wind: "km/h", solar: "W/m2" },
      },
    );
    expect(res.body.status).toBe("done");
    // The 01:00 row of the 21st starts a day with one hour of 24: left out, and said so.
    expect(res.body.report.warnings).toEqual(["2026-11-21: 1 of 24 intervals, not written"]);
    const [day] = await db("weather_days").where({ station_id: stationId, date: "2026-11-20" });
    // Hand arithmetic over the fixture's 24 rows (stamps 01:00 … 00:00 mark each hour's end):
    // Tmax = max(temp) = 24, Tmin = min(temp) = 9; RHmax 96, RHmin 35, RHmean 1664 / 24 = 69.333;
    // wind mean 208.8 km/h / 24 = 8.7 km/h = 2.41667 m/s; solar Σ 7200 W/m² × 3600 s / 10⁶ = 25.92 MJ/m²;
    // rain 2.4 + 5.0 + 1.2 + 0.2 = 8.8 mm.
    expect(day).toMatchObject({ tmax_c: 24, tmin_c: 9, rh_max_pct: 96, rh_min_pct: 35 });
    expect(day.rh_mean_pct).toBeCloseTo(69.3333, 4);
    expect(day.wind_ms).toBeCloseTo(2.41667, 5);
    expect(day.solar_mj_m2).toBeCloseTo(25.92, 10);
    expect(day.rain_mm).toBeCloseTo(8.8, 10);
    expect(await db("weather_days").where({ station_id: stationId, date: "2026-11-21" })).toHaveLength(0);
  });
});

describe("local days when clocks change", () => {
  // Sydney moves to daylight time at 02:00 on Sunday 4 October 2026 (first Sunday of October, from
  // memory): that local day has 23 hours, so 23 hourly rows make it whole.
  function hours(fromUtcMs: number, count: number, stamp: (ms: number) => string): string {
    const rows = ["time,temp"];
    for (let i = 1; i <= count; i++) rows.push(`${stamp(fromUtcMs + i * 3_600_000)},${10 + i}`);
    return rows.join("\n");
  }
  const utc = (ms: number) => new Date(ms).toISOString().slice(0, 19) + "Z";

  it("takes a 23-hour local day as whole", async () => {
    // local midnight starting 4 October is 3 October 14:00 UTC (AEST, UTC+10)
    const csv = hours(Date.UTC(2026, 9, 3, 14), 23, utc);
    const options = weatherOptionsSchema.parse({
      stationId,
      interval: "hourly",
      columns: { date: "time", temp: "temp" },
    });
    const parsed = await parseWeather(readCsv(csv), options, "Australia/Sydney");
    expect(parsed.warnings).toEqual([]);
    expect(parsed.days.map((d) => [d.date, d.tmaxC, d.tminC])).toEqual([["2026-10-04", 33, 11]]);
  });

  it("reads stamps that mark the start of each hour when told so", async () => {
    // 24 rows stamped 00:00 … 23:00 UTC with the farm in UTC: one whole day, the 5th
    const csv = hours(Date.UTC(2026, 9, 4, 23), 24, utc);
    const options = weatherOptionsSchema.parse({
      stationId,
      interval: "hourly",
      stampMarks: "start",
      columns: { date: "time", temp: "temp" },
    });
    const parsed = await parseWeather(readCsv(csv), options, "Etc/UTC");
    expect(parsed.days.map((d) => d.date)).toEqual(["2026-10-05"]);
  });
});

describe("refusals", () => {
  it("refuses a station of another farm as an invalid option (422), not as someone else's data", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.owner,
      { name: "imperial.csv", data: fixture("weather-daily-imperial.csv") },
      "weather_csv",
      { columns: { date: "Day" }, stationId: otherStationId },
    );
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("options.stationId");
  });

  it("names a mapped column the file does not have", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.owner,
      { name: "imperial.csv", data: fixture("weather-daily-imperial.csv") },
      "weather_csv",
      { columns: { date: "Day", tmax: "Tmax" }, stationId },
    );
    expect(res.status).toBe(422);
    expect(res.body.error?.fields?.["options.columns.tmax"]).toMatch(/no column "Tmax"/);
  });

  it("answers 413 for a file over 20 MB", async () => {
    const big = "date,rain\n" + "2026-11-01,0\n".repeat(1_700_000);
    expect(big.length).toBeGreaterThan(20 * 1024 * 1024);
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.owner,
      { name: "big.csv", data: big },
      "weather_csv",
      { columns: { date: "date", rain: "rain" }, stationId },
    );
    expect(res.status).toBe(413);
    expect(res.body.error?.code).toBe("payload_too_large");
  });

  it("shows a member of another farm nothing (404), a viewer may not import (403)", async () => {
    const outsider = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.outsider,
      { name: "a.csv", data: "x" },
      "weather_csv",
      {},
    );
    expect(outsider.status).toBe(404);
    const viewer = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.viewer,
      { name: "a.csv", data: "x" },
      "weather_csv",
      {},
    );
    expect(viewer.status).toBe(403);
  });
});

describe("reading imports back", () => {
  it("lists past imports with their reports, and shows one by id only on its farm", async () => {
    const list = await call<{ data: ImportBody[]; page: { total: number } }>(
      importsRoute.GET,
      `/api/v1/farms/${team.farmId}/imports`,
      { as: team.worker, params: { farmId: team.farmId } },
    );
    expect(list.status).toBe(200);
    expect(list.body.page.total).toBeGreaterThanOrEqual(4);
    const rejected = list.body.data.find((i) => i.status === "rejected");
    expect(rejected?.report.rejected.length).toBe(6);
    const one = await call<ImportBody>(importRoute.GET, "/x", {
      as: team.viewer,
      params: { farmId: team.farmId, importId: rejected!.id },
    });
    expect(one.status).toBe(403);
    const mine = await call<ImportBody>(importRoute.GET, "/x", {
      as: team.worker,
      params: { farmId: team.farmId, importId: rejected!.id },
    });
    expect(mine.body).toMatchObject({ id: rejected!.id, status: "rejected", progress: 1 });
    const other = await createFarmTeam();
    const theirs = await call(importRoute.GET, "/x", {
      as: other.owner,
      params: { farmId: other.farmId, importId: rejected!.id },
    });
    expect(theirs.status).toBe(404);
  });
});
