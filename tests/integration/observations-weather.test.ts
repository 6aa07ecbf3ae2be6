/**
 * Weather days against a real database: upsert on station, date and kind; observed and forecast side by
 * side; validation naming the day and value; dirty marks for every field of the farm.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { queue } from "@/lib/jobs/queue";
import * as weather from "@/app/api/v1/farms/[farmId]/weather-days/route";
import { call, type ApiJson } from "../helpers/api";
import { createFarmTeam, type FarmTeam, type TestUser } from "../helpers/fixtures";

interface Day {
  date: string;
  kind: string;
  tmaxC: number | null;
  tminC: number | null;
  etoMm: number | null;
  source: string | null;
}

let team: FarmTeam;
let other: FarmTeam;
let stationId: string;
let otherStationId: string;
let fieldIds: string[];

beforeAll(async () => {
  team = await createFarmTeam();
  other = await createFarmTeam();
  [{ id: stationId }] = await db("weather_stations").insert({ farm_id: team.farmId, name: "Shed station" }).returning("id");
  [{ id: otherStationId }] = await db("weather_stations").insert({ farm_id: other.farmId, name: "Their station" }).returning("id");
  const rows = await db("fields")
    .insert([
      { farm_id: team.farmId, name: "A", area_ha: 3 },
      { farm_id: team.farmId, name: "B", area_ha: 4 },
    ])
    .returning("id");
  fieldIds = rows.map((r: { id: string }) => r.id);
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

const url = () => `/api/v1/farms/${team.farmId}/weather-days`;
const post = (body: unknown, as: TestUser = team.worker) =>
  call<ApiJson & { inserted: number; updated: number }>(weather.POST, url(), { method: "POST", as, params: { farmId: team.farmId }, body });
const list = (query: string, as: TestUser = team.viewer) =>
  call<{ data: Day[]; page: { total: number } }>(weather.GET, `${url()}?${query}`, { as, params: { farmId: team.farmId } });

// Invented fixture values, within FAO-56's usual daily ranges.
const observed = [
  { date: "2026-11-27", tmaxC: 31.2, tminC: 16.4, rhMaxPct: 82, rhMinPct: 31, windMs: 2.4, solarMJm2: 28.1 },
  { date: "2026-11-28", tmaxC: 33.0, tminC: 18.1 },
];

describe("weather days", () => {
  it("stores a station's observed days and marks every field dirty from the first", async () => {
    const res = await post({ stationId, source: "shed logger", days: observed });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ inserted: 2, updated: 0 });
    const dirty = await db("fields").whereIn("id", fieldIds).pluck("account_dirty_from");
    expect(dirty).toEqual(["2026-11-27", "2026-11-27"]);
    expect(await db("jobs.job").where({ name: "recompute", singleton_key: team.farmId }).first("id")).toBeDefined();
    const entry = await db("audit_log").where({ entity: "weather_days", entity_id: stationId }).first();
    expect(entry).toMatchObject({ user_id: team.worker.id, actor: "user" });
  });

  it("replaces a day of the same date and kind; a forecast for the same date sits beside the observation", async () => {
    const again = await post({ stationId, source: "shed logger, corrected", days: [{ ...observed[1], tmaxC: 32.5 }] });
    expect(again.body).toEqual({ inserted: 0, updated: 1 });
    const forecast = await post({ stationId, source: "forecast service", kind: "forecast", days: [{ date: "2026-11-28", etoMm: 6.1 }, { date: "2026-11-29", etoMm: 6.4 }] });
    expect(forecast.body).toEqual({ inserted: 2, updated: 0 });
    const days = await list(`stationId=${stationId}&from=2026-11-28&to=2026-11-28`);
    expect(days.body.data.map((d) => [d.kind, d.tmaxC, d.etoMm, d.source])).toEqual([
      ["forecast", null, 6.1, "forecast service"],
      ["observed", 32.5, null, "shed logger, corrected"],
    ]);
    expect((await list("kind=forecast")).body.page.total).toBe(2);
    expect((await list("kind=observed")).body.page.total).toBe(2);
  });

  it("names the day and the value that are wrong", async () => {
    const res = await post({ stationId, source: "x", days: [observed[0], { date: "2026-11-30", tmaxC: 10, tminC: 12 }] });
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("days.1.tmaxC");
    const noSource = await post({ stationId, days: observed });
    expect(noSource.body.error?.fields).toHaveProperty("source");
    const badKind = await list("kind=guessed");
    expect(badKind.status).toBe(422);
    expect(badKind.body as unknown as ApiJson).toMatchObject({ error: { fields: { kind: expect.any(String) } } });
  });

  it("refuses viewers (403), members of other farms (404) and other farms' stations (404)", async () => {
    expect((await post({ stationId, source: "x", days: observed }, team.viewer)).status).toBe(403);
    expect((await post({ stationId, source: "x", days: observed }, team.outsider)).status).toBe(404);
    const guessed = await post({ stationId: otherStationId, source: "x", days: observed });
    expect(guessed.status).toBe(404);
    expect(guessed.body.error?.fields).toHaveProperty("stationId");
    const theirs = await call<{ data: Day[] }>(weather.GET, `/api/v1/farms/${other.farmId}/weather-days`, { as: other.owner, params: { farmId: other.farmId } });
    expect(theirs.body.data).toEqual([]);
  });
});
