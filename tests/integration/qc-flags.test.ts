/**
 * Quality control on stored values: flags are raised once, values are never changed or removed, and
 * a person decides whether a flagged value counts (audited).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import * as flagsRoute from "@/app/api/v1/farms/[farmId]/flags/route";
import * as flagRoute from "@/app/api/v1/farms/[farmId]/flags/[flagId]/route";
import { queue } from "@/lib/jobs/queue";
import { runRecomputeJob } from "@/lib/jobs/recompute";
import { QC_LIMITS } from "@/lib/qc/rules";
import { runFarmQc } from "@/lib/qc/run";
import * as readingsRoute from "@/app/api/v1/farms/[farmId]/rain-readings/route";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

interface Flag {
  id: string;
  entity: string;
  entityId: string;
  rule: string;
  status: string;
  reason: string | null;
  decidedBy: string | null;
}

let team: FarmTeam;
let other: FarmTeam;
const ids: Record<string, string> = {};
const DAY = "2026-11-10";

async function reading(gauge: string, depthMm: number): Promise<string> {
  const [row] = await db("rain_readings")
    .insert({ gauge_id: gauge, read_at: "2026-11-10T22:00:00Z", rain_date: DAY, depth_mm: depthMm })
    .returning("id");
  return row.id;
}

const list = (as = team.worker, query = "") =>
  call<{ data: Flag[]; page: { total: number } }>(
    flagsRoute.GET,
    `/api/v1/farms/${team.farmId}/flags${query}`,
    { as, params: { farmId: team.farmId } },
  );
const decide = (flagId: string, body: unknown, as = team.agronomist, farmId = team.farmId) =>
  call<Flag>(flagRoute.PATCH, "/x", { method: "PATCH", as, params: { farmId, flagId }, body });

beforeAll(async () => {
  team = await createFarmTeam();
  other = await createFarmTeam();
  const gauges = await db("gauges")
    .insert(["East", "West", "Mid"].map((name) => ({ farm_id: team.farmId, name, kind: "manual" })))
    .returning(["id", "name"]);
  for (const g of gauges) ids[g.name] = g.id;
  ids.east = await reading(ids.East ?? "", 18);
  ids.west = await reading(ids.West ?? "", 21);
  ids.mid = await reading(ids.Mid ?? "", 0);
  const [station] = await db("weather_stations")
    .insert({ farm_id: team.farmId, name: "Met", latitude: -34.4, longitude: 146 })
    .returning("id");
  const [w] = await db("weather_days")
    .insert({
      station_id: station.id,
      date: DAY,
      kind: "observed",
      tmax_c: 55,
      tmin_c: 20,
      wind_ms: 19,
      rain_mm: 20,
    })
    .returning("id");
  ids.weather = w.id;
  const [field] = await db("fields")
    .insert({ farm_id: team.farmId, name: "Block 1", area_ha: 10 })
    .returning("id");
  ids.field = field.id;
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

describe("running quality control", () => {
  it("flags suspect values and marks their rows, changing no value", async () => {
    const result = await runFarmQc(team.farmId, "2026-11-01", "2026-11-30");
    expect(result.opened).toBe(3);
    const flags = await db("qc_flags").where({ farm_id: team.farmId }).orderBy("rule");
    expect(flags.map((f) => [f.entity, f.rule])).toEqual([
      ["weather_day", "temperature_range"],
      ["weather_day", "wind_range"],
      ["rain_reading", "zero_when_neighbours_wet"],
    ]);
    const mid = await db("rain_readings").where({ id: ids.mid }).first();
    expect(mid).toMatchObject({ depth_mm: 0, flagged: true });
    expect(mid.flag_reason).toContain("no rain here");
    const weather = await db("weather_days").where({ id: ids.weather }).first();
    expect(weather).toMatchObject({ tmax_c: 55, wind_ms: 19, flagged: true });
    expect(weather.flag_reason.split("; ")).toHaveLength(2);
    expect(await db("rain_readings").where({ id: ids.east }).first()).toMatchObject({
      flagged: false,
      flag_reason: null,
    });
  });

  it("leaves alone a flag set on a row by someone else", async () => {
    const [row] = await db("rain_readings")
      .insert({
        gauge_id: ids.East,
        read_at: "2026-11-11T22:00:00Z",
        rain_date: "2026-11-11",
        depth_mm: 3,
        flagged: true,
        flag_reason: "bird bath",
      })
      .returning("id");
    await runFarmQc(team.farmId, "2026-11-11", "2026-11-11");
    expect(await db("rain_readings").where({ id: row.id }).first()).toMatchObject({
      flagged: true,
      flag_reason: "bird bath",
    });
  });

  it("raises nothing twice when run again", async () => {
    const result = await runFarmQc(team.farmId, "2026-11-01", "2026-11-30");
    expect(result).toMatchObject({ opened: 0, closed: 0, rowsChanged: 0 });
    expect(await db("qc_flags").where({ farm_id: team.farmId })).toHaveLength(3);
  });
});

describe("the flags API", () => {
  it("lists open flags to those who log; viewers may not, other farms see nothing", async () => {
    const res = await list(team.worker, "?status=open");
    expect(res.status).toBe(200);
    expect(res.body.page.total).toBe(3);
    expect((await list(team.viewer)).status).toBe(403);
    const outsider = await call(flagsRoute.GET, "/x", { as: team.outsider, params: { farmId: team.farmId } });
    expect(outsider.status).toBe(404);
  });

  it("lets an agronomist accept a value, which then counts; workers may not decide", async () => {
    const flag = (await list()).body.data.find((f) => f.rule === "zero_when_neighbours_wet")!;
    expect((await decide(flag.id, { status: "accepted" }, team.worker)).status).toBe(403);
    const res = await decide(flag.id, { status: "accepted", reason: "gauge was covered for harvest" });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: "accepted", decidedBy: team.agronomist.id });
    expect(await db("rain_readings").where({ id: ids.mid }).first()).toMatchObject({
      depth_mm: 0,
      flagged: false,
      flag_reason: null,
    });
    const entry = await db("audit_log").where({ entity: "qc_flag", entity_id: flag.id }).first();
    expect(entry).toMatchObject({
      user_id: team.agronomist.id,
      action: "qc.decide",
      reason: "gauge was covered for harvest",
    });
    expect(entry.before.status).toBe("open");
    expect(entry.after.status).toBe("accepted");
    // whether a value counts changes the account from that day on
    expect((await db("fields").where({ id: ids.field }).first()).account_dirty_from).toBe(DAY);
    // a later run does not reopen what a person decided
    await runFarmQc(team.farmId, DAY, DAY);
    expect(await db("qc_flags").where({ id: flag.id }).first()).toMatchObject({ status: "accepted" });
    expect(await db("rain_readings").where({ id: ids.mid }).first()).toMatchObject({ flagged: false });
  });

  it("needs a reason to override, and keeps the value flagged with it", async () => {
    const flag = (await list(team.worker, "?status=open")).body.data.find((f) => f.rule === "wind_range")!;
    const bare = await decide(flag.id, { status: "overridden" });
    expect(bare.status).toBe(422);
    expect(bare.body).toMatchObject({ error: { fields: { reason: "Say why the value is set aside" } } });
    const res = await decide(
      flag.id,
      { status: "overridden", reason: "anemometer cup broken" },
      team.manager,
    );
    expect(res.body).toMatchObject({ status: "overridden", reason: "anemometer cup broken" });
    const weather = await db("weather_days").where({ id: ids.weather }).first();
    expect(weather.flagged).toBe(true);
    expect(weather.flag_reason).toContain("set aside: anemometer cup broken");
  });

  it("drops an open flag once the value is corrected, and unmarks the row", async () => {
    await db("weather_days").where({ id: ids.weather }).update({ tmax_c: 31 });
    const result = await runFarmQc(team.farmId, DAY, DAY);
    expect(result.closed).toBe(1);
    expect((await list(team.worker, "?status=open")).body.page.total).toBe(0);
    const weather = await db("weather_days").where({ id: ids.weather }).first();
    expect(weather.flag_reason).not.toContain("range in one day");
    expect(weather.flag_reason).toContain("anemometer"); // the overridden flag stays
  });

  it("answers 404 for another farm's flag and for a flag id that is not one", async () => {
    const flag = (await list()).body.data[0]!;
    expect((await decide(flag.id, { status: "accepted" }, other.owner, other.farmId)).status).toBe(404);
    expect((await decide("not-a-uuid", { status: "accepted" })).status).toBe(404);
  });
});

describe("quality control in the recompute job", () => {
  it("flags a reading that came in through the API before the account is rewritten", async () => {
    const farm = await createFarmTeam();
    const [gauge] = await db("gauges").insert({ farm_id: farm.farmId, name: "Paddock gauge", kind: "manual" }).returning("id");
    await db("fields").insert({ farm_id: farm.farmId, name: "Block 9", area_ha: 4, gauge_id: gauge.id });
    const depthMm = QC_LIMITS.rainDayMm + 50;
    const posted = await call<{ reading: { id: string } }>(readingsRoute.POST, `/api/v1/farms/${farm.farmId}/rain-readings`, {
      method: "POST",
      as: farm.worker,
      params: { farmId: farm.farmId },
      body: { gaugeId: gauge.id, readAt: "2026-11-21T09:00:00+11:00", rainDate: "2026-11-20", depthMm },
    });
    expect(posted.status).toBe(201);
    const readingId = posted.body.reading.id;
    expect(await db("qc_flags").where({ entity_id: readingId })).toHaveLength(0);
    await runRecomputeJob({ farmId: farm.farmId });
    const flags = await db("qc_flags").where({ entity_id: readingId }).select("rule", "status");
    expect(flags).toEqual([{ rule: "rain_range", status: "open" }]);
    const row = await db("rain_readings").where({ id: readingId }).first("flagged", "depth_mm");
    expect(row).toEqual({ flagged: true, depth_mm: depthMm });
  });
});
