/**
 * Irrigation systems, rain gauges and weather stations: what a farm owns on the ground.
 */
import { randomUUID } from "node:crypto";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as gaugeItem from "@/app/api/v1/farms/[farmId]/gauges/[gaugeId]/route";
import * as gaugeList from "@/app/api/v1/farms/[farmId]/gauges/route";
import * as stationItem from "@/app/api/v1/farms/[farmId]/stations/[stationId]/route";
import * as stationList from "@/app/api/v1/farms/[farmId]/stations/route";
import * as systemItem from "@/app/api/v1/farms/[farmId]/systems/[systemId]/route";
import * as systemList from "@/app/api/v1/farms/[farmId]/systems/route";
import { db } from "@/db/knex";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

let team: FarmTeam;
let otherFarmId: string;

type Item = Record<string, unknown> & { id: string; archivedAt: string | null };
interface Body {
  [key: string]: unknown;
  data?: Item[];
  error?: { code: string; message: string; fields?: Record<string, string> };
}

beforeAll(async () => {
  team = await createFarmTeam();
  otherFarmId = (await db("memberships").where({ user_id: team.outsider.id }).first("farm_id")).farm_id;
});

afterAll(async () => {
  const g = globalThis as { rootbankBoss?: Promise<PgBoss> };
  if (g.rootbankBoss) await (await g.rootbankBoss).stop({ graceful: false, wait: true });
  await db("fields").whereIn("farm_id", [team.farmId, otherFarmId]).delete();
  await db("farms").whereIn("id", [team.farmId, otherFarmId]).delete();
  await db.destroy();
});

interface Case {
  noun: string;
  table: string;
  segment: string;
  param: string;
  key: string;
  entity: string;
  list: typeof systemList;
  item: typeof systemItem;
  valid: () => Record<string, unknown>;
  /** a body with one value out of range, and the field the error must name */
  invalid: [Record<string, unknown>, string][];
  change: Record<string, unknown>;
  otherFarmRow: () => Record<string, unknown>;
}

const CASES: Case[] = [
  {
    noun: "irrigation system",
    table: "irrigation_systems",
    segment: "systems",
    param: "systemId",
    key: "system",
    entity: "irrigation_system",
    list: systemList,
    item: systemItem,
    valid: () => ({ name: `Pivot ${randomUUID().slice(0, 6)}`, kind: "pivot", applicationEfficiency: 0.85, flowM3H: 180, capacityMmDay: 9 }),
    invalid: [
      [{ name: "x", kind: "pivot", applicationEfficiency: 0 }, "applicationEfficiency"],
      [{ name: "x", kind: "pivot", applicationEfficiency: 1.2 }, "applicationEfficiency"],
      [{ name: "x", kind: "pivot", applicationEfficiency: 0.8, capacityMmDay: 800 }, "capacityMmDay"],
      [{ name: "x", kind: "pivot", applicationEfficiency: 0.8, flowM3H: -5 }, "flowM3H"],
      [{ name: "x", kind: "sprinkler", applicationEfficiency: 0.8 }, "kind"],
      [{ name: "x", kind: "drip" }, "applicationEfficiency"],
    ],
    change: { applicationEfficiency: 0.8, pumpName: "River pump 2" },
    otherFarmRow: () => ({ farm_id: otherFarmId, name: `Theirs ${randomUUID().slice(0, 6)}`, kind: "drip", application_efficiency: 0.9 }),
  },
  {
    noun: "rain gauge",
    table: "gauges",
    segment: "gauges",
    param: "gaugeId",
    key: "gauge",
    entity: "gauge",
    list: gaugeList as unknown as typeof systemList,
    item: gaugeItem as unknown as typeof systemItem,
    valid: () => ({ name: `Gauge ${randomUUID().slice(0, 6)}`, kind: "recording", latitude: -34.45, longitude: 146.04, resolutionMm: 0.2 }),
    invalid: [
      [{ name: "x", kind: "manual", latitude: -95, longitude: 146 }, "latitude"],
      [{ name: "x", kind: "manual", latitude: -34, longitude: 190 }, "longitude"],
      [{ name: "x", kind: "manual", latitude: -34 }, "longitude"],
      [{ name: "x", kind: "recording", resolutionMm: 10 }, "resolutionMm"],
      [{ name: "x", kind: "radar" }, "kind"],
    ],
    change: { latitude: -34.46, longitude: 146.05 },
    otherFarmRow: () => ({ farm_id: otherFarmId, name: `Theirs ${randomUUID().slice(0, 6)}`, kind: "manual" }),
  },
  {
    noun: "weather station",
    table: "weather_stations",
    segment: "stations",
    param: "stationId",
    key: "station",
    entity: "weather_station",
    list: stationList as unknown as typeof systemList,
    item: stationItem as unknown as typeof systemItem,
    valid: () => ({ name: `Station ${randomUUID().slice(0, 6)}`, latitude: -34.45, longitude: 146.03, elevationM: 130 }),
    invalid: [
      [{ name: "x", windHeightM: 0.2 }, "windHeightM"],
      [{ name: "x", elevationM: 9000 }, "elevationM"],
      [{ name: "x", longitude: 146 }, "latitude"],
      [{ name: "x", coastal: "yes" }, "coastal"],
    ],
    change: { elevationM: 135, windHeightM: 3 },
    otherFarmRow: () => ({ farm_id: otherFarmId, name: `Theirs ${randomUUID().slice(0, 6)}` }),
  },
];

describe.each(CASES)("$noun", (c) => {
  const base = () => `/api/v1/farms/${team.farmId}/${c.segment}`;
  const listParams = () => ({ farmId: team.farmId });
  const itemParams = (id: string) => ({ farmId: team.farmId, [c.param]: id });
  const create = (body: Record<string, unknown>, as = team.manager) =>
    call<Body>(c.list.POST, base(), { method: "POST", as, params: listParams(), body });

  it("creates, reads, lists, changes and archives, each write audited", async () => {
    const body = c.valid();
    const made = await create(body);
    expect(made.status).toBe(201);
    const row = made.body[c.key] as Item;
    expect(row).toMatchObject({ ...body, farmId: team.farmId, archivedAt: null });

    const got = await call<Body>(c.item.GET, `${base()}/${row.id}`, { as: team.viewer, params: itemParams(row.id) });
    expect(got.body[c.key]).toEqual(row);

    const changed = await call<Body>(c.item.PATCH, `${base()}/${row.id}`, { method: "PATCH", as: team.owner, params: itemParams(row.id), body: c.change });
    expect(changed.status).toBe(200);
    expect(changed.body[c.key]).toMatchObject({ ...body, ...c.change });

    expect((await call(c.item.DELETE, `${base()}/${row.id}`, { method: "DELETE", as: team.manager, params: itemParams(row.id) })).status).toBe(204);
    const list = await call<Body>(c.list.GET, `${base()}?limit=1000`, { as: team.worker, params: listParams() });
    expect(list.body.data!.map((r) => r.id)).not.toContain(row.id);
    const all = await call<Body>(c.list.GET, `${base()}?limit=1000&includeArchived=true`, { as: team.worker, params: listParams() });
    expect(all.body.data!.find((r) => r.id === row.id)?.archivedAt).toEqual(expect.any(String));

    const audit = await db("audit_log").where({ entity: c.entity, entity_id: row.id }).orderBy("id").select("action", "user_id", "before", "after");
    expect(audit.map((a) => a.action)).toEqual(["create", "update", "archive"]);
    expect(audit[1]).toMatchObject({ user_id: team.owner.id, after: c.change });
    expect(audit[2].before.archivedAt).toBeNull();
  });

  it("answers a repeat of a client id with the stored row (200) and stores it once", async () => {
    const id = randomUUID();
    const body = { ...c.valid(), id };
    const first = await create(body);
    const again = await create(body);
    expect([first.status, again.status]).toEqual([201, 200]);
    expect(again.body[c.key]).toEqual(first.body[c.key]);
    expect(await db(c.table).where({ id }).count({ n: "*" })).toEqual([{ n: 1 }]);
    expect(await db("audit_log").where({ entity: c.entity, entity_id: id }).count({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("names the field of a value out of range (422)", async () => {
    for (const [body, field] of c.invalid) {
      const res = await create(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error!.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
  });

  it("checks a change against the stored row: half a location is refused", async () => {
    const made = await create(c.valid());
    const id = (made.body[c.key] as Item).id;
    const res = await call<Body>(c.item.PATCH, `${base()}/${id}`, { method: "PATCH", as: team.manager, params: itemParams(id), body: c.key === "system" ? { applicationEfficiency: 0 } : { latitude: null } });
    expect(res.status).toBe(422);
  });

  it("refuses an agronomist and a worker (403) and a stranger (404)", async () => {
    for (const as of [team.agronomist, team.worker, team.viewer]) expect((await create(c.valid(), as)).status).toBe(403);
    expect((await create(c.valid(), team.outsider)).status).toBe(404);
    expect((await call(c.list.GET, base(), { as: team.outsider, params: listParams() })).status).toBe(404);
  });

  it("gives 404 for another farm's id under this farm's URL, leaving that row alone", async () => {
    const [{ id }] = await db(c.table).insert(c.otherFarmRow()).returning("id");
    expect((await call(c.item.GET, `${base()}/${id}`, { as: team.owner, params: itemParams(id) })).status).toBe(404);
    expect((await call(c.item.PATCH, `${base()}/${id}`, { method: "PATCH", as: team.owner, params: itemParams(id), body: { name: "Mine now" } })).status).toBe(404);
    expect((await call(c.item.DELETE, `${base()}/${id}`, { method: "DELETE", as: team.owner, params: itemParams(id) })).status).toBe(404);
    expect(await db(c.table).where({ id }).first("archived_at", "name")).toMatchObject({ archived_at: null });
    // Taking the other farm's id for a new row of this farm is a conflict, not a takeover.
    const res = await create({ ...c.valid(), id });
    expect(res.status).toBe(409);
  });

  it("refuses a second row in use with the same name (409 naming the name)", async () => {
    const body = c.valid();
    await create(body);
    const res = await create(body);
    expect(res.status).toBe(409);
    expect(res.body.error!.fields).toHaveProperty("name");
  });
});

describe("what changes an account", () => {
  it("marks fields on a system stale when its application efficiency changes", async () => {
    const made = await call<Body>(systemList.POST, `/api/v1/farms/${team.farmId}/systems`, { method: "POST", as: team.manager, params: { farmId: team.farmId }, body: { name: "Drip block", kind: "drip", applicationEfficiency: 0.9 } });
    const systemId = (made.body.system as Item).id;
    const [{ id: soilId }] = await db("soils").insert({ farm_id: team.farmId, name: "Fixture loam", texture: "loam", theta_fc: 0.25, theta_wp: 0.12, theta_sat: 0.46 }).returning("id");
    const [{ id: cropId }] = await db("crops").insert({ farm_id: team.farmId, name: "Fixture vines", kc_ini: 0.3, kc_mid: 0.7, kc_end: 0.45, stage_ini_days: 30, stage_dev_days: 60, stage_mid_days: 40, stage_late_days: 80, root_min_m: 0.5, root_max_m: 1, p: 0.45 }).returning("id");
    const [{ id: fieldId }] = await db("fields").insert({ farm_id: team.farmId, name: "Vines", area_ha: 4, soil_id: soilId, irrigation_system_id: systemId }).returning("id");
    await db("plantings").insert({ field_id: fieldId, season: "2026-27", crop_id: cropId, planting_date: "2026-09-01" });
    await call(systemItem.PATCH, `/api/v1/farms/${team.farmId}/systems/${systemId}`, { method: "PATCH", as: team.manager, params: { farmId: team.farmId, systemId }, body: { pumpName: "Bore" } });
    expect(await db("fields").where({ id: fieldId }).first("account_dirty_from")).toEqual({ account_dirty_from: null });
    await call(systemItem.PATCH, `/api/v1/farms/${team.farmId}/systems/${systemId}`, { method: "PATCH", as: team.manager, params: { farmId: team.farmId, systemId }, body: { applicationEfficiency: 0.85 } });
    expect(await db("fields").where({ id: fieldId }).first("account_dirty_from")).toEqual({ account_dirty_from: "2026-09-01" });
    await db("plantings").where({ field_id: fieldId }).delete();
    await db("fields").where({ id: fieldId }).delete();
  });

  it("marks every field of the farm stale when a gauge or station moves, since rain and weather are shared by distance", async () => {
    const [{ id: soilId }] = await db("soils").insert({ farm_id: team.farmId, name: "Moves loam", texture: "loam", theta_fc: 0.25, theta_wp: 0.12, theta_sat: 0.46 }).returning("id");
    const [{ id: cropId }] = await db("crops").insert({ farm_id: team.farmId, name: "Moves lucerne", kc_ini: 0.4, kc_mid: 0.95, kc_end: 0.9, stage_ini_days: 10, stage_dev_days: 30, stage_mid_days: 25, stage_late_days: 10, root_min_m: 0.3, root_max_m: 1.2, p: 0.55 }).returning("id");
    const fieldIds = (await db("fields").insert([
      { farm_id: team.farmId, name: "Moves east", area_ha: 3, soil_id: soilId },
      { farm_id: team.farmId, name: "Moves west", area_ha: 5, soil_id: soilId },
    ]).returning("id")).map((r: { id: string }) => r.id);
    await db("plantings").insert(fieldIds.map((field_id, k) => ({ field_id, season: "2026-27", crop_id: cropId, planting_date: k === 0 ? "2026-10-01" : "2026-10-15" })));
    const dirty = async () => (await db("fields").whereIn("id", fieldIds).orderBy("name").pluck("account_dirty_from")) as (string | null)[];
    const post = async (list: typeof gaugeList, segment: string, body: Record<string, unknown>) =>
      (await call<Body>(list.POST, `/api/v1/farms/${team.farmId}/${segment}`, { method: "POST", as: team.manager, params: { farmId: team.farmId }, body })).body;
    const gauge = (await post(gaugeList, "gauges", { name: "Moves gauge", kind: "manual", latitude: -34.4, longitude: 146 })).gauge as Item;
    const station = (await post(stationList, "stations", { name: "Moves station", latitude: -34.4, longitude: 146 })).station as Item;

    await call(gaugeItem.PATCH, "/x", { method: "PATCH", as: team.manager, params: { farmId: team.farmId, gaugeId: gauge.id }, body: { name: "Moves gauge renamed" } });
    expect(await dirty()).toEqual([null, null]); // a name is not an input of the account
    await call(gaugeItem.PATCH, "/x", { method: "PATCH", as: team.manager, params: { farmId: team.farmId, gaugeId: gauge.id }, body: { latitude: -34.41 } });
    expect(await dirty()).toEqual(["2026-10-01", "2026-10-15"]);

    await db("fields").whereIn("id", fieldIds).update({ account_dirty_from: null });
    await call(stationItem.PATCH, "/x", { method: "PATCH", as: team.manager, params: { farmId: team.farmId, stationId: station.id }, body: { elevationM: 140 } });
    expect(await dirty()).toEqual(["2026-10-01", "2026-10-15"]);

    await db("plantings").whereIn("field_id", fieldIds).delete();
    await db("fields").whereIn("id", fieldIds).delete();
  });
});
