/**
 * Rain files: a tipping-bucket logger's tips, a logger's interval depths and a backfill of manual
 * gauge readings. Times are the farm's local time (Australia/Sydney, AEDT = UTC+11 in November).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import * as importsRoute from "@/app/api/v1/farms/[farmId]/imports/route";
import { queue } from "@/lib/jobs/queue";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";
import { fixture, upload } from "../fixtures/imports/upload";

interface ImportBody {
  id: string;
  status: string;
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
const gauge: Record<string, string> = {};

beforeAll(async () => {
  team = await createFarmTeam();
  for (const [name, kind, lat] of [
    ["North gauge", "manual", -34.4],
    ["South gauge", "manual", -34.45],
    ["Logger", "recording", -34.42],
  ] as const) {
    const [row] = await db("gauges")
      .insert({
        farm_id: team.farmId,
        name,
        kind,
        latitude: lat,
        longitude: 146.0,
        resolution_mm: kind === "recording" ? 0.2 : 0.5,
      })
      .returning("id");
    gauge[name] = row.id;
  }
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

describe("tipping-bucket tips", () => {
  it("stores one record per tip at the gauge's resolution, in UTC, and flags the double tip", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "tips.csv", data: fixture("rain-tips.csv") },
      "rain_csv",
      {
        gaugeId: gauge.Logger,
        mode: "tips",
        columns: { time: "tip_time" },
      },
    );
    expect(res.status).toBe(201);
    expect(res.body.counts).toMatchObject({ rows: 5, accepted: 5, inserted: 5, rejected: 0 });
    const records = await db("rain_records").where({ gauge_id: gauge.Logger }).orderBy("at");
    expect(records.map((r) => r.depth_mm)).toEqual([0.2, 0.2, 0.2, 0.2, 0.2]);
    expect(records.every((r) => r.interval_s === null)).toBe(true);
    // 14:00 local on 21 November 2026 in Sydney (AEDT, UTC+11) is 03:00 UTC
    expect(records[0].at.toISOString()).toBe("2026-11-21T03:00:00.000Z");
    // The second tip of 14:03:10 came 0.4 s after the first: faster than a bucket can tip again.
    const flagged = records.filter((r) => r.flagged);
    expect(flagged).toHaveLength(1);
    expect(flagged[0].at.toISOString()).toBe("2026-11-21T03:03:10.400Z");
    const flags = await db("qc_flags").where({ farm_id: team.farmId, entity: "rain_record" });
    expect(flags).toMatchObject([
      { rule: "double_tip", status: "open", entity_id: String(flagged[0].id), date: "2026-11-21" },
    ]);
  });

  it("leaves stored tips alone when the file comes again", async () => {
    const before = await db("rain_records").where({ gauge_id: gauge.Logger }).orderBy("at");
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "tips.csv", data: fixture("rain-tips.csv") },
      "rain_csv",
      {
        gaugeId: gauge.Logger,
        mode: "tips",
        columns: { time: "tip_time" },
      },
    );
    expect(res.status).toBe(200);
    // the same tips under another mapping of the same file still do not duplicate
    const again = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "tips.csv", data: fixture("rain-tips.csv") },
      "rain_csv",
      {
        gaugeId: gauge.Logger,
        mode: "tips",
        columns: { time: "TIP_TIME" },
      },
    );
    expect(again.body.counts).toMatchObject({ inserted: 0, updated: 0, unchanged: 5 });
    expect(await db("rain_records").where({ gauge_id: gauge.Logger }).orderBy("at")).toEqual(before);
  });
});

describe("refusals", () => {
  it("refuses logger records for a manual gauge, naming the option", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "tips.csv", data: fixture("rain-tips.csv") },
      "rain_csv",
      {
        gaugeId: gauge["North gauge"],
        mode: "tips",
        columns: { time: "tip_time" },
      },
    );
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toEqual({ "options.gaugeId": "Not a recording gauge" });
  });

  it("names each invalid option", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "tips.csv", data: fixture("rain-tips.csv") },
      "rain_csv",
      {
        gaugeId: "nope",
        mode: "drips",
        columns: {},
      },
    );
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error?.fields ?? {}).sort()).toEqual([
      "options.columns.time",
      "options.gaugeId",
      "options.mode",
    ]);
  });
});

describe("logger intervals", () => {
  const options = () => ({
    gaugeId: gauge.Logger,
    mode: "intervals",
    columns: { time: "end", depth: "depth_mm" },
  });

  it("reports the broken rows and writes nothing by default", async () => {
    const before = await db("rain_records").count<{ n: string }[]>({ n: "*" });
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "intervals.csv", data: fixture("rain-intervals-broken.csv") },
      "rain_csv",
      options(),
    );
    expect(res.body.status).toBe("rejected");
    expect(res.body.report.rejected).toEqual([
      { line: 4, column: "depth_mm", value: "minus", reason: "not a depth (a number ≥ 0)" },
      { line: 6, column: "depth_mm", value: "-0.2", reason: "not a depth (a number ≥ 0)" },
      { line: 7, column: "end", value: "not a time", reason: "not a date and time" },
    ]);
    expect(await db("rain_records").count<{ n: string }[]>({ n: "*" })).toEqual(before);
  });

  it("writes the good rows when asked, each interval running from the stamp before it", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "intervals.csv", data: fixture("rain-intervals-broken.csv") },
      "rain_csv",
      { ...options(), writeGoodRows: true },
    );
    expect(res.body.status).toBe("done");
    expect(res.body.report.warnings).toContain("1 intervals with no rain skipped");
    const rows = await db("rain_records")
      .where({ gauge_id: gauge.Logger })
      .where("at", ">=", "2026-11-21T03:10:00Z")
      .orderBy("at");
    // 14:10 is the first stamp (interval unknown); 14:20 follows 14:10; 15:00 follows 14:50, whose
    // depth was bad but whose stamp still closes an interval.
    expect(rows.map((r) => [r.at.toISOString(), r.depth_mm, r.interval_s])).toEqual([
      ["2026-11-21T03:10:00.000Z", 0.4, null],
      ["2026-11-21T03:20:00.000Z", 1.2, 600],
      ["2026-11-21T04:00:00.000Z", 0.8, 600],
    ]);
  });
});

describe("manual gauge readings backfill", () => {
  it("finds gauges by name, books each reading to its rain day, and reports the rest", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "readings.csv", data: fixture("gauge-readings.csv") },
      "gauge_readings_csv",
      {
        columns: { gauge: "gauge", time: "read", depth: "depth" },
        writeGoodRows: true,
      },
    );
    expect(res.body.status).toBe("done");
    expect(res.body.report.rejected).toEqual([
      {
        line: 5,
        column: "gauge",
        value: "Nowhere gauge",
        reason: "no gauge of this farm has this name or id",
      },
      { line: 6, column: "depth", value: "lots", reason: "not a depth between 0 and 1000 mm" },
    ]);
    const rows = await db("rain_readings")
      .whereIn("gauge_id", [gauge["North gauge"] ?? "", gauge["South gauge"] ?? ""])
      .orderBy(["rain_date", "depth_mm"]);
    // A 09:00 reading (the farm's boundary hour) closes the day before (REFERENCES, facts of practice);
    // a reading with a date only is taken as read at 09:00 that day.
    expect(rows.map((r) => [r.gauge_id, r.rain_date, r.depth_mm])).toEqual([
      [gauge["South gauge"], "2026-11-01", 11],
      [gauge["North gauge"], "2026-11-01", 12.5],
      [gauge["North gauge"], "2026-11-02", 0],
    ]);
    expect(rows[2].read_at.toISOString()).toBe("2026-11-02T22:00:00.000Z"); // 09:00 AEDT on the 3rd
    expect(rows.every((r) => r.created_by === team.worker.id)).toBe(true);
  });

  it("updates a changed reading, audited with its value before and after", async () => {
    const csv = "gauge,read,depth\nNorth gauge,2026-11-02 09:00,13.0\n";
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.agronomist,
      { name: "fix.csv", data: csv },
      "gauge_readings_csv",
      { columns: { gauge: "gauge", time: "read", depth: "depth" } },
    );
    expect(res.body.counts).toMatchObject({ inserted: 0, updated: 1 });
    const [row] = await db("rain_readings").where({
      gauge_id: gauge["North gauge"],
      rain_date: "2026-11-01",
    });
    expect(row.depth_mm).toBe(13);
    const entry = await db("audit_log")
      .where({ entity: "rain_reading", entity_id: row.id, action: "update" })
      .first();
    expect(entry.before.depth_mm).toBe(12.5);
    expect(entry.after.depth_mm).toBe(13);
    expect(entry.user_id).toBe(team.agronomist.id);
  });
});
