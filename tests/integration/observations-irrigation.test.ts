/**
 * Irrigation events and soil checks against a real database: depth from volume, run hours and meter
 * readings checked by hand arithmetic, the local date of an event, corrections, and per-field dirty marks.
 */
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { queue } from "@/lib/jobs/queue";
import * as events from "@/app/api/v1/farms/[farmId]/irrigation-events/route";
import * as event from "@/app/api/v1/farms/[farmId]/irrigation-events/[eventId]/route";
import * as checks from "@/app/api/v1/farms/[farmId]/soil-checks/route";
import * as check from "@/app/api/v1/farms/[farmId]/soil-checks/[checkId]/route";
import { call, type ApiJson } from "../helpers/api";
import { createFarmTeam, type FarmTeam, type TestUser } from "../helpers/fixtures";

interface Event {
  id: string;
  fieldId: string;
  systemId: string | null;
  date: string;
  method: string;
  grossDepthMm: number;
  netDepthMm: number | null;
  volumeM3: number | null;
  hours: number | null;
}
type EventBody = ApiJson & { event: Event };
interface Check {
  id: string;
  fieldId: string;
  date: string;
  depletionMm: number;
  method: string;
  resetsAccount: boolean;
}
type CheckBody = ApiJson & { check: Check };

let team: FarmTeam;
let other: FarmTeam;
/** 2.5 ha under a pivot: 80 % application efficiency, 100 m³/h (invented fixture) */
let pivotField: string;
/** 1 ha, no system */
let smallField: string;
let pivot: string;
let noFlowSystem: string;
let otherField: string;

beforeAll(async () => {
  team = await createFarmTeam();
  other = await createFarmTeam();
  const [p, d] = await db("irrigation_systems")
    .insert([
      { farm_id: team.farmId, name: "Pivot 1", kind: "pivot", application_efficiency: 0.8, flow_m3_h: 100 },
      { farm_id: team.farmId, name: "Drip block", kind: "drip", application_efficiency: 0.9 },
    ])
    .returning("id");
  pivot = p.id;
  noFlowSystem = d.id;
  const [f1, f2] = await db("fields")
    .insert([
      { farm_id: team.farmId, name: "Pivot paddock", area_ha: 2.5, irrigation_system_id: pivot },
      { farm_id: team.farmId, name: "House block", area_ha: 1 },
    ])
    .returning("id");
  pivotField = f1.id;
  smallField = f2.id;
  const [f3] = await db("fields").insert({ farm_id: other.farmId, name: "Theirs", area_ha: 4 }).returning("id");
  otherField = f3.id;
});

beforeEach(async () => {
  await db("fields").whereIn("id", [pivotField, smallField]).update({ account_dirty_from: null });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

const eventsUrl = (farmId = team.farmId) => `/api/v1/farms/${farmId}/irrigation-events`;
const postEvent = (body: Record<string, unknown>, as: TestUser = team.worker, farmId = team.farmId) =>
  call<EventBody>(events.POST, eventsUrl(farmId), { method: "POST", as, params: { farmId }, body: { startedAt: "2026-11-20T06:00:00+11:00", ...body } });

async function dirty(): Promise<Record<string, string | null>> {
  const rows = await db("fields").whereIn("id", [pivotField, smallField]).select("id", "account_dirty_from");
  return Object.fromEntries(rows.map((r: { id: string; account_dirty_from: string | null }) => [r.id, r.account_dirty_from]));
}

describe("irrigation events", () => {
  it("by gross depth: net = gross × application efficiency (25 mm × 0.8 = 20 mm, hand arithmetic)", async () => {
    const res = await postEvent({ fieldId: pivotField, method: "depth", grossDepthMm: 25 });
    expect(res.status).toBe(201);
    expect(res.body.event).toMatchObject({ systemId: pivot, method: "depth", grossDepthMm: 25, date: "2026-11-20" });
    expect(res.body.event.netDepthMm).toBeCloseTo(20, 9);
  });

  it("by net depth: gross = net / efficiency (20 mm / 0.8 = 25 mm, hand arithmetic)", async () => {
    const res = await postEvent({ fieldId: pivotField, method: "depth", netDepthMm: 20 });
    expect(res.body.event.grossDepthMm).toBeCloseTo(25, 9);
    expect(res.body.event.netDepthMm).toBe(20);
  });

  it("by volume: 1 ML over 1 ha is 100 mm (common practice)", async () => {
    const res = await postEvent({ fieldId: smallField, method: "volume", volumeM3: 1000 });
    expect(res.status).toBe(201);
    expect(res.body.event.grossDepthMm).toBeCloseTo(100, 9);
    expect(res.body.event).toMatchObject({ volumeM3: 1000, netDepthMm: null, systemId: null });
  });

  it("by hours × flow: 5 h × 100 m³/h = 500 m³ over 2.5 ha = 20 mm (hand arithmetic)", async () => {
    const res = await postEvent({ fieldId: pivotField, method: "hours", hours: 5 });
    expect(res.body.event).toMatchObject({ hours: 5, volumeM3: 500 });
    expect(res.body.event.grossDepthMm).toBeCloseTo(20, 9);
    expect(res.body.event.netDepthMm).toBeCloseTo(16, 9);
  });

  it("by meter readings: 1450 − 1200 = 250 m³ over 2.5 ha = 10 mm (hand arithmetic)", async () => {
    const res = await postEvent({ fieldId: pivotField, method: "meter", meterStart: 1200, meterEnd: 1450 });
    expect(res.body.event.volumeM3).toBe(250);
    expect(res.body.event.grossDepthMm).toBeCloseTo(10, 9);
  });

  it("dates an event by its start in the farm's time zone, and marks only its field dirty", async () => {
    // 14:30 UTC on 30 November is 01:30 on 1 December in Sydney (daylight time, +11:00)
    const res = await postEvent({ fieldId: smallField, method: "depth", grossDepthMm: 12, startedAt: "2026-11-30T14:30:00Z" });
    expect(res.body.event.date).toBe("2026-12-01");
    expect(await dirty()).toEqual({ [smallField]: "2026-12-01", [pivotField]: null });
    expect(await db("jobs.job").where({ name: "recompute", singleton_key: team.farmId }).first("id")).toBeDefined();
  });

  it("names what is missing or impossible", async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ fieldId: pivotField, method: "depth" }, "grossDepthMm"],
      [{ fieldId: pivotField, method: "depth", grossDepthMm: 10, netDepthMm: 8 }, "netDepthMm"],
      [{ fieldId: pivotField, method: "volume" }, "volumeM3"],
      [{ fieldId: pivotField, method: "meter", meterStart: 50, meterEnd: 40 }, "meterEnd"],
      [{ fieldId: pivotField, method: "bucket", grossDepthMm: 10 }, "method"],
      [{ fieldId: pivotField, method: "depth", grossDepthMm: 10, endedAt: "2026-11-20T05:00:00+11:00" }, "endedAt"],
      // 20 000 m³ over 2.5 ha would be 800 mm at once
      [{ fieldId: pivotField, method: "volume", volumeM3: 20_000 }, "volumeM3"],
      [{ fieldId: pivotField, method: "hours", hours: 3, systemId: noFlowSystem }, "hours"],
      [{ fieldId: smallField, method: "depth", netDepthMm: 10 }, "netDepthMm"],
    ];
    for (const [body, field] of cases) {
      const res = await postEvent(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(res.body.error?.fields, JSON.stringify(body)).toHaveProperty(field);
    }
  });

  it("returns the stored event (200) for a repeated client id", async () => {
    const id = randomUUID();
    const first = await postEvent({ id, fieldId: pivotField, method: "depth", grossDepthMm: 15 });
    const again = await postEvent({ id, fieldId: pivotField, method: "depth", grossDepthMm: 15 });
    expect([first.status, again.status]).toEqual([201, 200]);
    expect(again.body.event).toEqual(first.body.event);
    // the same id from another farm is refused and reveals nothing
    const theirs = await postEvent({ id, fieldId: otherField, method: "depth", grossDepthMm: 15 }, other.worker, other.farmId);
    expect(theirs.status).toBe(409);
  });

  it("refuses viewers (403), other farms (404) and other farms' fields and systems (404)", async () => {
    expect((await postEvent({ fieldId: pivotField, method: "depth", grossDepthMm: 5 }, team.viewer)).status).toBe(403);
    expect((await postEvent({ fieldId: pivotField, method: "depth", grossDepthMm: 5 }, team.outsider)).status).toBe(404);
    const field = await postEvent({ fieldId: otherField, method: "depth", grossDepthMm: 5 });
    expect(field.status).toBe(404);
    expect(field.body.error?.fields).toHaveProperty("fieldId");
    const system = await postEvent({ fieldId: otherField, method: "depth", grossDepthMm: 5, systemId: pivot }, other.worker, other.farmId);
    expect(system.status).toBe(404);
    expect(system.body.error?.fields).toHaveProperty("systemId");
  });

  it("corrects an event, working the depth out again, with the reason audited", async () => {
    const { body } = await postEvent({ fieldId: pivotField, method: "hours", hours: 5, startedAt: "2026-11-10T06:00:00+11:00" });
    const id = body.event.id;
    const params = { farmId: team.farmId, eventId: id };
    const res = await call<EventBody>(event.PATCH, `${eventsUrl()}/${id}`, {
      method: "PATCH",
      as: team.manager,
      params,
      body: { method: "volume", volumeM3: 750, startedAt: "2026-11-09T06:00:00+11:00", reason: "pump ran on the 9th, meter read" },
    });
    expect(res.status).toBe(200);
    // 750 m³ over 2.5 ha = 30 mm (hand arithmetic); the old hours are gone
    expect(res.body.event).toMatchObject({ method: "volume", volumeM3: 750, hours: null, date: "2026-11-09" });
    expect(res.body.event.grossDepthMm).toBeCloseTo(30, 9);
    expect((await dirty())[pivotField]).toBe("2026-11-09");
    const entry = await db("audit_log").where({ entity: "irrigation_event", entity_id: id, action: "update" }).first();
    expect(entry).toMatchObject({ user_id: team.manager.id, reason: "pump ran on the 9th, meter read" });
    expect(entry.before).toMatchObject({ method: "hours", hours: 5 });
    const bad = await call(event.PATCH, `${eventsUrl()}/${id}`, { method: "PATCH", as: team.worker, params, body: { method: "meter" } });
    expect(bad.status).toBe(422);
    expect(bad.body.error?.fields).toHaveProperty("meterStart");
  });

  it("lists a field's events in a date range, gets one, deletes one; other farms' ids are 404", async () => {
    const list = await call<{ data: Event[] }>(events.GET, `${eventsUrl()}?fieldId=${smallField}&from=2026-11-01&to=2026-11-30`, {
      as: team.viewer,
      params: { farmId: team.farmId },
    });
    expect(list.status).toBe(200);
    expect(list.body.data.map((e) => e.grossDepthMm)).toEqual([100]);
    const { body } = await postEvent({ fieldId: smallField, method: "depth", grossDepthMm: 8, startedAt: "2026-11-25T06:00:00+11:00" });
    const params = { farmId: team.farmId, eventId: body.event.id };
    expect((await call<EventBody>(event.GET, `${eventsUrl()}/${params.eventId}`, { as: team.viewer, params })).body.event.grossDepthMm).toBe(8);
    const theirs = await postEvent({ fieldId: otherField, method: "depth", grossDepthMm: 5 }, other.worker, other.farmId);
    const foreign = { farmId: team.farmId, eventId: theirs.body.event.id };
    expect((await call(event.GET, `${eventsUrl()}/${foreign.eventId}`, { as: team.owner, params: foreign })).status).toBe(404);
    expect((await call(event.DELETE, `${eventsUrl()}/${foreign.eventId}`, { method: "DELETE", as: team.owner, params: foreign })).status).toBe(404);
    await db("fields").whereIn("id", [smallField]).update({ account_dirty_from: null });
    expect((await call(event.DELETE, `${eventsUrl()}/${params.eventId}`, { method: "DELETE", as: team.worker, params })).status).toBe(204);
    expect((await call(event.GET, `${eventsUrl()}/${params.eventId}`, { as: team.viewer, params })).status).toBe(404);
    expect((await dirty())[smallField]).toBe("2026-11-25");
    expect(await db("audit_log").where({ entity: "irrigation_event", entity_id: params.eventId, action: "delete" }).first()).toBeDefined();
  });
});

describe("soil checks", () => {
  const checksUrl = () => `/api/v1/farms/${team.farmId}/soil-checks`;
  const postCheck = (body: Record<string, unknown>, as: TestUser = team.worker) =>
    call<CheckBody>(checks.POST, checksUrl(), { method: "POST", as, params: { farmId: team.farmId }, body });

  it("logs a check, dated by the farm's day of the time it was taken, and marks its field", async () => {
    // 22:00 UTC on 14 November is 09:00 on the 15th in Sydney
    const res = await postCheck({ fieldId: pivotField, checkedAt: "2026-11-14T22:00:00Z", depletionMm: 42, method: "probe", depthM: 0.6 });
    expect(res.status).toBe(201);
    expect(res.body.check).toMatchObject({ fieldId: pivotField, date: "2026-11-15", depletionMm: 42, method: "probe", resetsAccount: true });
    expect(await dirty()).toEqual({ [pivotField]: "2026-11-15", [smallField]: null });
  });

  it("is idempotent by client id and names bad fields", async () => {
    const id = randomUUID();
    const body = { id, fieldId: smallField, date: "2026-11-16", depletionMm: 30, method: "feel" };
    expect((await postCheck(body)).status).toBe(201);
    expect((await postCheck(body)).status).toBe(200);
    const bad = await postCheck({ fieldId: smallField, date: "2026-11-16", depletionMm: -1, method: "guess" });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error?.fields ?? {}).sort()).toEqual(["depletionMm", "method"]);
    const noDay = await postCheck({ fieldId: smallField, depletionMm: 10, method: "feel" });
    expect(noDay.body.error?.fields).toHaveProperty("date");
  });

  it("refuses viewers (403) and other farms' fields (404)", async () => {
    expect((await postCheck({ fieldId: smallField, date: "2026-11-16", depletionMm: 3, method: "feel" }, team.viewer)).status).toBe(403);
    expect((await postCheck({ fieldId: otherField, date: "2026-11-16", depletionMm: 3, method: "feel" })).status).toBe(404);
  });

  it("corrects, lists and deletes a check", async () => {
    const { body } = await postCheck({ fieldId: smallField, date: "2026-11-20", depletionMm: 50, method: "sensor" });
    const params = { farmId: team.farmId, checkId: body.check.id };
    const patched = await call<CheckBody>(check.PATCH, `${checksUrl()}/${params.checkId}`, {
      method: "PATCH",
      as: team.agronomist,
      params,
      body: { depletionMm: 35, date: "2026-11-19", reason: "sensor recalibrated" },
    });
    expect(patched.body.check).toMatchObject({ depletionMm: 35, date: "2026-11-19" });
    expect((await dirty())[smallField]).toBe("2026-11-19");
    expect(await db("audit_log").where({ entity: "soil_check", entity_id: params.checkId, action: "update" }).first()).toMatchObject({ reason: "sensor recalibrated" });
    const list = await call<{ data: Check[] }>(checks.GET, `${checksUrl()}?fieldId=${smallField}&from=2026-11-17`, { as: team.viewer, params: { farmId: team.farmId } });
    expect(list.body.data.map((c) => c.depletionMm)).toEqual([35]);
    expect((await call(check.DELETE, `${checksUrl()}/${params.checkId}`, { method: "DELETE", as: team.worker, params })).status).toBe(204);
    expect((await call(check.GET, `${checksUrl()}/${params.checkId}`, { as: team.worker, params })).status).toBe(404);
    expect((await call(check.GET, `${checksUrl()}/${randomUUID()}`, { as: team.worker, params: { farmId: team.farmId, checkId: randomUUID() } })).status).toBe(404);
  });
});
