/**
 * Plantings: a crop in a field for a season, with the field's own Kc, stages, roots, p and trigger.
 */
import { randomUUID } from "node:crypto";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import * as plantingItem from "@/app/api/v1/farms/[farmId]/plantings/[plantingId]/route";
import * as plantingList from "@/app/api/v1/farms/[farmId]/plantings/route";
import { db } from "@/db/knex";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

let team: FarmTeam;
let otherFarmId: string;
let fieldId: string;
let otherFieldId: string;
let cropId: string;
let libraryCropId: string;
let theirCropId: string;
const suffix = randomUUID().slice(0, 8);

type PlantingJson = Record<string, unknown> & { id: string; plantingDate: string };
interface Body {
  planting?: PlantingJson;
  data?: PlantingJson[];
  page?: { total: number };
  error?: { code: string; message: string; fields?: Record<string, string> };
}

const url = (path = "") => `/api/v1/farms/${team.farmId}/plantings${path}`;
const post = (body: Record<string, unknown>, as = team.agronomist) => call<Body>(plantingList.POST, url(), { method: "POST", as, params: { farmId: team.farmId }, body });
const patch = (id: string, body: Record<string, unknown>, as = team.agronomist) =>
  call<Body>(plantingItem.PATCH, url(`/${id}`), { method: "PATCH", as, params: { farmId: team.farmId, plantingId: id }, body });
const dirtyFrom = async (id: string) => (await db("fields").where({ id }).first("account_dirty_from")).account_dirty_from as string | null;

// Fixture crop values from FAO-56 Table 12 and Table 11 (maize, grain): Kc 0.3 / 1.2 / 0.35; stages 30/40/50/30 days.
const maize = { kc_ini: 0.3, kc_mid: 1.2, kc_end: 0.35, stage_ini_days: 30, stage_dev_days: 40, stage_mid_days: 50, stage_late_days: 30, root_min_m: 0.15, root_max_m: 1.0, p: 0.55 };

beforeAll(async () => {
  team = await createFarmTeam();
  otherFarmId = (await db("memberships").where({ user_id: team.outsider.id }).first("farm_id")).farm_id;
  [{ id: cropId }] = await db("crops").insert({ farm_id: team.farmId, name: "Our maize", ...maize }).returning("id");
  [{ id: libraryCropId }] = await db("crops").insert({ farm_id: null, name: `Library maize ${suffix}`, ...maize }).returning("id");
  [{ id: theirCropId }] = await db("crops").insert({ farm_id: otherFarmId, name: "Their maize", ...maize }).returning("id");
  [{ id: otherFieldId }] = await db("fields").insert({ farm_id: otherFarmId, name: "Their paddock", area_ha: 20 }).returning("id");
});

beforeEach(async () => {
  [{ id: fieldId }] = await db("fields").insert({ farm_id: team.farmId, name: `Paddock ${randomUUID().slice(0, 6)}`, area_ha: 25 }).returning("id");
});

afterAll(async () => {
  const g = globalThis as { rootbankBoss?: Promise<PgBoss> };
  if (g.rootbankBoss) await (await g.rootbankBoss).stop({ graceful: false, wait: true });
  const farms = [team.farmId, otherFarmId];
  await db("plantings").whereIn("field_id", db("fields").whereIn("farm_id", farms).select("id")).delete();
  await db("fields").whereIn("farm_id", farms).delete();
  await db("farms").whereIn("id", farms).delete();
  await db("crops").where({ id: libraryCropId }).delete();
  await db.destroy();
});

describe("plantings", () => {
  it("plants a crop with per-field overrides, marks the field stale from the planting date, audits it", async () => {
    const res = await post({ fieldId, season: "2026-27", cropId, plantingDate: "2026-10-12", kcMid: 1.15, stageMidDays: 55, rootMaxM: 1.2, p: 0.5, mad: 0.45, climateAdjust: false });
    expect(res.status).toBe(201);
    expect(res.body.planting).toMatchObject({ fieldId, cropId, plantingDate: "2026-10-12", endDate: null, kcMid: 1.15, kcIni: null, stageMidDays: 55, rootMaxM: 1.2, mad: 0.45, climateAdjust: false, initialDepletionMm: 0 });
    expect(await dirtyFrom(fieldId)).toBe("2026-10-12");
    const audit = await db("audit_log").where({ entity: "planting", entity_id: res.body.planting!.id }).select("action", "user_id", "after");
    expect(audit).toMatchObject([{ action: "create", user_id: team.agronomist.id, after: { kcMid: 1.15 } }]);
  });

  it("accepts a library crop, and names a crop or field of another farm (422)", async () => {
    expect((await post({ fieldId, season: "2026-27", cropId: libraryCropId, plantingDate: "2026-10-01" })).status).toBe(201);
    const crop = await post({ fieldId, season: "2027-28", cropId: theirCropId, plantingDate: "2027-10-01" });
    expect(crop.status).toBe(422);
    expect(crop.body.error!.fields).toHaveProperty("cropId");
    const field = await post({ fieldId: otherFieldId, season: "2026-27", cropId, plantingDate: "2026-10-01" });
    expect(field.status).toBe(422);
    expect(field.body.error!.fields).toHaveProperty("fieldId");
  });

  it("names bad dates and overrides out of range", async () => {
    const base = { fieldId, season: "2026-27", cropId, plantingDate: "2026-10-01" };
    const cases: [Record<string, unknown>, string][] = [
      [{ ...base, plantingDate: "2026-02-30" }, "plantingDate"],
      [{ ...base, plantingDate: "1/10/2026" }, "plantingDate"],
      [{ ...base, endDate: "2026-09-30" }, "endDate"],
      [{ ...base, kcMid: 2.5 }, "kcMid"],
      [{ ...base, mad: 1 }, "mad"],
      [{ ...base, p: 0 }, "p"],
      [{ ...base, stageLateDays: -3 }, "stageLateDays"],
      [{ ...base, rootMaxM: 6 }, "rootMaxM"],
      // The crop's maximum root depth (1.0 m) counts where the planting gives none.
      [{ ...base, rootMinM: 1.4 }, "rootMinM"],
      [{ ...base, initialDepletionMm: -1 }, "initialDepletionMm"],
      [{ ...base, season: " " }, "season"],
      [{ fieldId, cropId, plantingDate: "2026-10-01" }, "season"],
    ];
    for (const [body, field] of cases) {
      const res = await post(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error!.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
    expect(await db("plantings").where({ field_id: fieldId }).count({ n: "*" })).toEqual([{ n: 0 }]);
  });

  it("refuses a planting that overlaps another on the same field (409 naming the dates)", async () => {
    await post({ fieldId, season: "2025-26", cropId, plantingDate: "2025-10-01", endDate: "2026-04-15" });
    const clash = await post({ fieldId, season: "2026-27", cropId, plantingDate: "2026-04-01" });
    expect(clash.status).toBe(409);
    expect(clash.body.error!.fields!.plantingDate).toContain("2025-10-01");
    expect((await post({ fieldId, season: "2026-27", cropId, plantingDate: "2026-04-16" })).status).toBe(201);
  });

  it("answers a repeated client id with the stored planting (200), once", async () => {
    const id = randomUUID();
    const body = { id, fieldId, season: "2026-27", cropId, plantingDate: "2026-10-05" };
    const a = await post(body);
    const b = await post(body);
    expect([a.status, b.status]).toEqual([201, 200]);
    expect(b.body.planting).toEqual(a.body.planting);
    expect(await db("audit_log").where({ entity: "planting", entity_id: id }).count({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("marks the field stale from the earlier of the old and new planting dates on a change", async () => {
    const made = await post({ fieldId, season: "2026-27", cropId, plantingDate: "2026-10-10" });
    const id = made.body.planting!.id;
    await db("fields").where({ id: fieldId }).update({ account_dirty_from: null });
    const note = await patch(id, { note: "north end sown late" });
    expect(note.status).toBe(200);
    expect(await dirtyFrom(fieldId)).toBeNull();
    await patch(id, { plantingDate: "2026-10-20", kcMid: 1.1 });
    expect(await dirtyFrom(fieldId)).toBe("2026-10-10");
    const audit = await db("audit_log").where({ entity: "planting", entity_id: id }).orderBy("id").select("action", "before", "after");
    expect(audit[2]).toMatchObject({ action: "update", before: { plantingDate: "2026-10-10", kcMid: null }, after: { plantingDate: "2026-10-20", kcMid: 1.1 } });
    const bad = await patch(id, { endDate: "2026-10-01" });
    expect(bad.body.error!.fields).toHaveProperty("endDate");
  });

  it("lists the farm's plantings, for one field when asked", async () => {
    await post({ fieldId, season: "2026-27", cropId, plantingDate: "2026-10-01" });
    const one = await call<Body>(plantingList.GET, url(`?fieldId=${fieldId}`), { as: team.viewer, params: { farmId: team.farmId } });
    expect(one.body.data!.map((p) => p.plantingDate)).toEqual(["2026-10-01"]);
    const all = await call<Body>(plantingList.GET, url("?limit=1000"), { as: team.worker, params: { farmId: team.farmId } });
    expect(all.body.page!.total).toBeGreaterThan(1);
    expect((await call<Body>(plantingList.GET, url("?fieldId=nope"), { as: team.viewer, params: { farmId: team.farmId } })).status).toBe(422);
  });

  it("deletes a planting, marking the field stale from its planting date", async () => {
    const made = await post({ fieldId, season: "2026-27", cropId, plantingDate: "2026-09-20" });
    const id = made.body.planting!.id;
    await db("fields").where({ id: fieldId }).update({ account_dirty_from: null });
    const res = await call(plantingItem.DELETE, url(`/${id}`), { method: "DELETE", as: team.manager, params: { farmId: team.farmId, plantingId: id } });
    expect(res.status).toBe(204);
    expect(await dirtyFrom(fieldId)).toBe("2026-09-20");
    expect(await db("audit_log").where({ entity: "planting", entity_id: id }).orderBy("id").pluck("action")).toEqual(["create", "delete"]);
  });

  it("refuses a worker (403), a stranger (404) and another farm's planting under this farm's URL (404)", async () => {
    const body = { fieldId, season: "2026-27", cropId, plantingDate: "2026-10-01" };
    expect((await post(body, team.worker)).status).toBe(403);
    expect((await post(body, team.viewer)).status).toBe(403);
    expect((await post(body, team.outsider)).status).toBe(404);
    const [{ id }] = await db("plantings").insert({ field_id: otherFieldId, season: "2026-27", crop_id: theirCropId, planting_date: "2026-10-01" }).returning("id");
    const params = { farmId: team.farmId, plantingId: id };
    expect((await call(plantingItem.GET, url(`/${id}`), { as: team.owner, params })).status).toBe(404);
    expect((await patch(id, { kcMid: 1 }, team.owner)).status).toBe(404);
    expect((await call(plantingItem.DELETE, url(`/${id}`), { method: "DELETE", as: team.owner, params })).status).toBe(404);
    expect(await db("plantings").where({ id }).first("kc_mid")).toEqual({ kc_mid: null });
  });
});
