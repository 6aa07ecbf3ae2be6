/**
 * Soils and crops: the published library every farm reads, and the farm's own copies it may tune.
 */
import { randomUUID } from "node:crypto";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as soilItem from "@/app/api/v1/farms/[farmId]/soils/[soilId]/route";
import * as soilList from "@/app/api/v1/farms/[farmId]/soils/route";
import * as cropItem from "@/app/api/v1/farms/[farmId]/crops/[cropId]/route";
import * as cropList from "@/app/api/v1/farms/[farmId]/crops/route";
import { db } from "@/db/knex";
import { findTexture } from "@/lib/waterbalance";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

let team: FarmTeam;
let otherFarmId: string;
let librarySoilId: string;
let libraryCropId: string;
const suffix = randomUUID().slice(0, 8);

const url = (path: string) => `/api/v1/farms/${team.farmId}${path}`;

interface Body {
  soil?: Record<string, unknown> & { id: string };
  crop?: Record<string, unknown> & { id: string };
  data?: (Record<string, unknown> & { id: string; library: boolean })[];
  page?: { total: number; nextOffset: number | null };
  error?: { code: string; fields?: Record<string, string> };
}

beforeAll(async () => {
  team = await createFarmTeam();
  const m = await db("memberships").where({ user_id: team.outsider.id }).first("farm_id");
  otherFarmId = m.farm_id;
  // Fixture library rows (invented values within the published ranges).
  [{ id: librarySoilId }] = await db("soils")
    .insert({ farm_id: null, name: `Library loam ${suffix}`, texture: "loam", theta_fc: 0.25, theta_wp: 0.12, theta_sat: 0.46, source: "fixture" })
    .returning("id");
  [{ id: libraryCropId }] = await db("crops")
    .insert({
      farm_id: null, name: `Library maize ${suffix}`, kc_ini: 0.3, kc_mid: 1.2, kc_end: 0.35,
      stage_ini_days: 30, stage_dev_days: 40, stage_mid_days: 50, stage_late_days: 30,
      root_min_m: 0.15, root_max_m: 1.0, p: 0.55, source: "fixture",
    })
    .returning("id");
});

afterAll(async () => {
  const g = globalThis as { rootbankBoss?: Promise<PgBoss> };
  if (g.rootbankBoss) await (await g.rootbankBoss).stop({ graceful: false, wait: true });
  // Plantings and fields first: they hold soils and crops without a cascade, so a farm cannot take them in one go.
  const farms = [team.farmId, otherFarmId];
  await db("plantings").whereIn("field_id", db("fields").whereIn("farm_id", farms).select("id")).delete();
  await db("fields").whereIn("farm_id", farms).delete();
  await db("farms").whereIn("id", farms).delete();
  await db("soils").where({ id: librarySoilId }).delete();
  await db("crops").where({ id: libraryCropId }).delete();
  await db.destroy();
});

async function auditOf(entity: string, entityId: string) {
  return db("audit_log").where({ entity, entity_id: entityId }).orderBy("id").select("action", "user_id", "before", "after");
}

/** A field of the team farm on `soilId`, planted on `plantingDate` with `cropId`, account up to date. */
async function plantedField(soilId: string, cropId: string, plantingDate: string): Promise<string> {
  const [{ id }] = await db("fields").insert({ farm_id: team.farmId, name: `Paddock ${randomUUID().slice(0, 6)}`, area_ha: 10, soil_id: soilId }).returning("id");
  await db("plantings").insert({ field_id: id, season: "2026-27", crop_id: cropId, planting_date: plantingDate });
  return id as string;
}

describe("soils", () => {
  it("lists the farm's own soils first, then the library's, marked library: true", async () => {
    const own = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.agronomist, params: { farmId: team.farmId }, body: { name: `Own sand ${suffix}`, texture: "sand" } });
    expect(own.status).toBe(201);
    const res = await call<Body>(soilList.GET, url("/soils?limit=1000"), { as: team.viewer, params: { farmId: team.farmId } });
    expect(res.status).toBe(200);
    const rows = res.body.data!;
    expect(rows[0]).toMatchObject({ id: own.body.soil!.id, library: false });
    expect(rows.find((r) => r.id === librarySoilId)).toMatchObject({ library: true, farmId: null });
    expect(rows.findIndex((r) => r.library)).toBeGreaterThan(rows.findIndex((r) => !r.library));
    expect(res.body.page!.total).toBe(rows.length);
  });

  it("pages the list with limit and offset", async () => {
    const first = await call<Body>(soilList.GET, url("/soils?limit=1"), { as: team.viewer, params: { farmId: team.farmId } });
    expect(first.body.data).toHaveLength(1);
    expect(first.body.page!.nextOffset).toBe(1);
    const bad = await call<Body>(soilList.GET, url("/soils?limit=0"), { as: team.viewer, params: { farmId: team.farmId } });
    expect(bad.status).toBe(422);
    expect(bad.body.error!.fields).toHaveProperty("limit");
  });

  it("creates a soil from a texture class with the engine's published defaults", async () => {
    const res = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.manager, params: { farmId: team.farmId }, body: { name: `Creek loam ${suffix}`, texture: "loam" } });
    expect(res.status).toBe(201);
    // FAO-56 Table 19, loam: θFC 0.20-0.30, θWP 0.07-0.17; the library default is each range's middle.
    expect(res.body.soil).toMatchObject({ texture: "loam", thetaFc: 0.25, thetaWp: 0.12, library: false, farmId: team.farmId });
    // Rawls, Brakensiek and Miller (1983) via Chow et al. (1988) Table 4.3.1, loam: porosity 0.463, Ks 0.34 cm/h.
    expect(res.body.soil).toMatchObject({ gaPorosity: 0.463, gaKsatMmH: 3.4 });
    expect(res.body.soil!.thetaSat).toBe(findTexture("loam")!.greenAmpt.porosity);
  });

  it("copies a library soil with fromLibraryId, values sent overriding the copy", async () => {
    const res = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { fromLibraryId: librarySoilId, name: `Tuned loam ${suffix}`, thetaFc: 0.27 } });
    expect(res.status).toBe(201);
    expect(res.body.soil).toMatchObject({ texture: "loam", thetaFc: 0.27, thetaWp: 0.12, thetaSat: 0.46, library: false });
    const audit = await auditOf("soil", res.body.soil!.id);
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: "create", user_id: team.owner.id, before: null });
    expect(audit[0].after).toMatchObject({ thetaFc: 0.27, name: `Tuned loam ${suffix}` });
  });

  it("refuses a copy of a soil that is not in the library, naming fromLibraryId", async () => {
    const [{ id }] = await db("soils").insert({ farm_id: otherFarmId, name: `Theirs ${suffix}`, texture: "clay", theta_fc: 0.36, theta_wp: 0.22, theta_sat: 0.47 }).returning("id");
    const res = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { fromLibraryId: id } });
    expect(res.status).toBe(422);
    expect(res.body.error!.fields).toHaveProperty("fromLibraryId");
  });

  it("answers a repeat of the same client id with the stored soil (200), once in the audit log", async () => {
    const id = randomUUID();
    const body = { id, name: `Offline clay ${suffix}`, texture: "clay" };
    const first = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.agronomist, params: { farmId: team.farmId }, body });
    const again = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.agronomist, params: { farmId: team.farmId }, body });
    expect(first.status).toBe(201);
    expect(again.status).toBe(200);
    expect(again.body.soil).toEqual(first.body.soil);
    expect(await db("soils").where({ id }).count({ n: "*" })).toEqual([{ n: 1 }]);
    expect(await auditOf("soil", id)).toHaveLength(1);
  });

  it("names the field of each value out of its physical range", async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ name: "x", texture: "loamy clay" }, "texture"],
      [{ name: "x", texture: "loam", thetaFc: 0.1, thetaWp: 0.2 }, "thetaWp"],
      [{ name: "x", texture: "loam", thetaFc: 1.3 }, "thetaFc"],
      [{ name: "x", texture: "loam", rewMm: 12, tewMm: 8 }, "rewMm"],
      [{ name: "x" }, "texture"],
      [{ name: "", texture: "loam" }, "name"],
      [{ name: "x", texture: "loam", thetaFC: 0.3 }, "_"],
    ];
    for (const [body, field] of cases) {
      const res = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body });
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error!.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
    const wp = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: cases[1]![0] });
    expect(wp.body.error!.fields!.thetaWp).toMatch(/wilting point/i);
  });

  it("refuses a duplicate name on the farm with 409 naming the name", async () => {
    const body = { name: `Twice ${suffix}`, texture: "silt" };
    await call(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body });
    const res = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body });
    expect(res.status).toBe(409);
    expect(res.body.error!.fields).toHaveProperty("name");
  });

  it("lets a worker read but not write (403), and shows an outsider nothing (404)", async () => {
    expect((await call(soilItem.GET, url(`/soils/${librarySoilId}`), { as: team.worker, params: { farmId: team.farmId, soilId: librarySoilId } })).status).toBe(200);
    const post = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.worker, params: { farmId: team.farmId }, body: { name: "w", texture: "loam" } });
    expect(post.status).toBe(403);
    const outsider = await call<Body>(soilList.GET, url("/soils"), { as: team.outsider, params: { farmId: team.farmId } });
    expect(outsider.status).toBe(404);
  });

  it("gives 404 for another farm's soil id under this farm's URL, and for ids that are not uuids", async () => {
    const [{ id }] = await db("soils").insert({ farm_id: otherFarmId, name: `Guess ${suffix}`, texture: "sand", theta_fc: 0.12, theta_wp: 0.04, theta_sat: 0.43 }).returning("id");
    const params = { farmId: team.farmId, soilId: id };
    expect((await call(soilItem.GET, url(`/soils/${id}`), { as: team.owner, params })).status).toBe(404);
    expect((await call(soilItem.PATCH, url(`/soils/${id}`), { method: "PATCH", as: team.owner, params, body: { thetaFc: 0.13 } })).status).toBe(404);
    expect((await call(soilItem.DELETE, url(`/soils/${id}`), { method: "DELETE", as: team.owner, params })).status).toBe(404);
    expect((await call(soilItem.GET, url("/soils/not-a-uuid"), { as: team.owner, params: { farmId: team.farmId, soilId: "not-a-uuid" } })).status).toBe(404);
    expect(await db("soils").where({ id }).first("theta_fc")).toEqual({ theta_fc: 0.12 });
  });

  it("keeps library soils read-only (403) and says how to tune one", async () => {
    const params = { farmId: team.farmId, soilId: librarySoilId };
    const res = await call<Body>(soilItem.PATCH, url(`/soils/${librarySoilId}`), { method: "PATCH", as: team.owner, params, body: { thetaFc: 0.3 } });
    expect(res.status).toBe(403);
    expect((await call(soilItem.DELETE, url(`/soils/${librarySoilId}`), { method: "DELETE", as: team.owner, params })).status).toBe(403);
  });

  it("audits a change before and after, and marks the fields on that soil stale from their planting date", async () => {
    const created = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { name: `Dirt ${suffix}`, texture: "silt-loam" } });
    const soilId = created.body.soil!.id;
    const fieldId = await plantedField(soilId, libraryCropId, "2026-10-15");
    const params = { farmId: team.farmId, soilId };
    const res = await call<Body>(soilItem.PATCH, url(`/soils/${soilId}`), { method: "PATCH", as: team.agronomist, params, body: { thetaFc: 0.3, note: "probe calibration" } });
    expect(res.status).toBe(200);
    expect(res.body.soil).toMatchObject({ thetaFc: 0.3, note: "probe calibration" });
    const audit = await auditOf("soil", soilId);
    expect(audit.map((a) => a.action)).toEqual(["create", "update"]);
    // Before: FAO-56 Table 19, silt loam θFC 0.22-0.36, the middle 0.29 as the texture's default.
    expect(audit[1]).toMatchObject({ user_id: team.agronomist.id, before: { thetaFc: 0.29 }, after: { thetaFc: 0.3 } });
    expect(await db("fields").where({ id: fieldId }).first("account_dirty_from")).toEqual({ account_dirty_from: "2026-10-15" });
    const jobs = await db("jobs.job").where({ name: "recompute", singleton_key: team.farmId }).count({ n: "*" });
    expect(Number(jobs[0]!.n)).toBeGreaterThan(0);
  });

  it("leaves the accounts alone when only the name or note changes", async () => {
    const created = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { name: `Quiet ${suffix}`, texture: "sand" } });
    const soilId = created.body.soil!.id;
    const fieldId = await plantedField(soilId, libraryCropId, "2026-09-01");
    await call(soilItem.PATCH, url(`/soils/${soilId}`), { method: "PATCH", as: team.owner, params: { farmId: team.farmId, soilId }, body: { name: `Quiet sand ${suffix}` } });
    expect(await db("fields").where({ id: fieldId }).first("account_dirty_from")).toEqual({ account_dirty_from: null });
  });

  it("checks a change against the stored values: wilting point above field capacity is refused", async () => {
    const created = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { name: `Check ${suffix}`, texture: "loam" } });
    const soilId = created.body.soil!.id;
    const res = await call<Body>(soilItem.PATCH, url(`/soils/${soilId}`), { method: "PATCH", as: team.owner, params: { farmId: team.farmId, soilId }, body: { thetaWp: 0.26 } });
    expect(res.status).toBe(422);
    expect(res.body.error!.fields).toHaveProperty("thetaWp");
  });

  it("deletes an unused soil (audited) and refuses one a field uses (409 naming the field)", async () => {
    const a = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { name: `Gone ${suffix}`, texture: "clay" } });
    const id = a.body.soil!.id;
    expect((await call(soilItem.DELETE, url(`/soils/${id}`), { method: "DELETE", as: team.manager, params: { farmId: team.farmId, soilId: id } })).status).toBe(204);
    expect((await auditOf("soil", id)).map((x) => x.action)).toEqual(["create", "delete"]);
    const b = await call<Body>(soilList.POST, url("/soils"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { name: `Used ${suffix}`, texture: "clay" } });
    const used = b.body.soil!.id;
    const fieldId = await plantedField(used, libraryCropId, "2026-10-01");
    const name = (await db("fields").where({ id: fieldId }).first("name")).name as string;
    const res = await call<Body & { error: { message: string } }>(soilItem.DELETE, url(`/soils/${used}`), { method: "DELETE", as: team.manager, params: { farmId: team.farmId, soilId: used } });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain(name);
  });
});

describe("crops", () => {
  const full = { kcIni: 0.4, kcMid: 1.15, kcEnd: 0.5, stageIniDays: 20, stageDevDays: 30, stageMidDays: 40, stageLateDays: 20, rootMinM: 0.15, rootMaxM: 0.9, p: 0.5 };

  it("lists the library's crops beside the farm's, and copies one to tune", async () => {
    const list = await call<Body>(cropList.GET, url("/crops?limit=1000"), { as: team.viewer, params: { farmId: team.farmId } });
    expect(list.body.data!.find((c) => c.id === libraryCropId)).toMatchObject({ library: true });
    const res = await call<Body>(cropList.POST, url("/crops"), { method: "POST", as: team.agronomist, params: { farmId: team.farmId }, body: { fromLibraryId: libraryCropId, name: `Our maize ${suffix}`, kcMid: 1.15 } });
    expect(res.status).toBe(201);
    expect(res.body.crop).toMatchObject({ kcIni: 0.3, kcMid: 1.15, stageMidDays: 50, library: false, farmId: team.farmId });
  });

  it("creates a crop from values, idempotently by client id", async () => {
    const id = randomUUID();
    const body = { id, name: `Beans ${suffix}`, ...full };
    const a = await call<Body>(cropList.POST, url("/crops"), { method: "POST", as: team.manager, params: { farmId: team.farmId }, body });
    const b = await call<Body>(cropList.POST, url("/crops"), { method: "POST", as: team.manager, params: { farmId: team.farmId }, body });
    expect([a.status, b.status]).toEqual([201, 200]);
    expect(b.body.crop!.id).toBe(id);
    expect(await auditOf("crop", id)).toHaveLength(1);
  });

  it("names the fields that are missing or out of range", async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ name: "x", ...full, kcMid: 2.4 }, "kcMid"],
      [{ name: "x", ...full, p: 0.99 }, "p"],
      [{ name: "x", ...full, rootMinM: 1.2, rootMaxM: 0.9 }, "rootMinM"],
      [{ name: "x", ...full, stageIniDays: 2.5 }, "stageIniDays"],
      [{ name: "x", ...full, stageIniDays: 0, stageDevDays: 0, stageMidDays: 0, stageLateDays: 0 }, "stageIniDays"],
      [{ name: "x", ...full, runoffCover: "lawn" }, "runoffCover"],
      [{ name: "x", kcIni: 0.4 }, "kcMid"],
    ];
    for (const [body, field] of cases) {
      const res = await call<Body>(cropList.POST, url("/crops"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body });
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error!.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
  });

  it("marks each field planted with a crop stale from its planting date when Kc changes", async () => {
    const created = await call<Body>(cropList.POST, url("/crops"), { method: "POST", as: team.owner, params: { farmId: team.farmId }, body: { name: `Cotton ${suffix}`, ...full } });
    const cropId = created.body.crop!.id;
    const early = await plantedField(librarySoilId, cropId, "2026-10-01");
    const late = await plantedField(librarySoilId, cropId, "2026-11-10");
    const res = await call<Body>(cropItem.PATCH, url(`/crops/${cropId}`), { method: "PATCH", as: team.agronomist, params: { farmId: team.farmId, cropId }, body: { kcMid: 1.2 } });
    expect(res.status).toBe(200);
    expect(await db("fields").where({ id: early }).first("account_dirty_from")).toEqual({ account_dirty_from: "2026-10-01" });
    expect(await db("fields").where({ id: late }).first("account_dirty_from")).toEqual({ account_dirty_from: "2026-11-10" });
    const audit = await auditOf("crop", cropId);
    expect(audit[1]).toMatchObject({ action: "update", before: { kcMid: 1.15 }, after: { kcMid: 1.2 } });
    // A crop in use cannot be deleted.
    expect((await call(cropItem.DELETE, url(`/crops/${cropId}`), { method: "DELETE", as: team.owner, params: { farmId: team.farmId, cropId } })).status).toBe(409);
  });

  it("refuses workers (403), strangers (404), other farms' crops (404) and library edits (403)", async () => {
    const post = await call(cropList.POST, url("/crops"), { method: "POST", as: team.worker, params: { farmId: team.farmId }, body: { name: "w", ...full } });
    expect(post.status).toBe(403);
    expect((await call(cropList.GET, url("/crops"), { as: team.outsider, params: { farmId: team.farmId } })).status).toBe(404);
    const [{ id }] = await db("crops").insert({ farm_id: otherFarmId, name: `Theirs ${suffix}`, kc_ini: 0.3, kc_mid: 1, kc_end: 0.3, stage_ini_days: 10, stage_dev_days: 10, stage_mid_days: 10, stage_late_days: 10, root_min_m: 0.1, root_max_m: 1, p: 0.5 }).returning("id");
    expect((await call(cropItem.GET, url(`/crops/${id}`), { as: team.owner, params: { farmId: team.farmId, cropId: id } })).status).toBe(404);
    expect((await call(cropItem.PATCH, url(`/crops/${id}`), { method: "PATCH", as: team.owner, params: { farmId: team.farmId, cropId: id }, body: { p: 0.4 } })).status).toBe(404);
    expect((await call(cropItem.PATCH, url(`/crops/${libraryCropId}`), { method: "PATCH", as: team.owner, params: { farmId: team.farmId, cropId: libraryCropId }, body: { p: 0.4 } })).status).toBe(403);
  });
});
