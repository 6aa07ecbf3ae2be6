/**
 * Fields: boundaries checked and measured, references kept within the farm, accounts marked stale.
 */
import { randomUUID } from "node:crypto";
import type { Polygon, Position } from "geojson";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as fieldItem from "@/app/api/v1/farms/[farmId]/fields/[fieldId]/route";
import * as fieldList from "@/app/api/v1/farms/[farmId]/fields/route";
import { db } from "@/db/knex";
import { boundaryAreaHa, boundarySchema } from "@/lib/geo/boundary";
import { IBIS_FLAT, KESTREL_BEND } from "../../seeds/demo/farms";
import { buildDemo } from "../../seeds/demo/scenario";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

let team: FarmTeam;
let otherFarmId: string;
let soilId: string;
let librarySoilId: string;
let cropId: string;
let theirSoilId: string;
let theirSystemId: string;
let archivedGaugeId: string;
const suffix = randomUUID().slice(0, 8);

type FieldJson = Record<string, unknown> & { id: string; areaHa: number; centroidLat: number | null; centroidLon: number | null; boundary: Polygon | null };
interface Body {
  field?: FieldJson;
  data?: FieldJson[];
  error?: { code: string; message: string; fields?: Record<string, string> };
}

/** WGS84 (NIMA TR8350.2): semi-major axis and flattening. */
const A = 6_378_137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);
const E = Math.sqrt(E2);
const RAD = Math.PI / 180;

/**
 * Area of the ellipsoid between the equator and latitude φ per radian of longitude is a²q(φ)/2, with
 * q from Snyder (1987) "Map Projections: A Working Manual", eq. 3-12 (from memory).
 */
function q(phi: number): number {
  const s = Math.sin(phi);
  return (1 - E2) * (s / (1 - E2 * s * s) - (1 / (2 * E)) * Math.log((1 - E * s) / (1 + E * s)));
}
function ellipsoidQuadM2(lat1: number, lat2: number, dLon: number): number {
  return ((A * A * dLon * RAD) / 2) * (q(lat2 * RAD) - q(lat1 * RAD));
}

/**
 * Area of a small polygon on the ellipsoid: positions put on a local plane with the meridian radius M and
 * the prime-vertical radius N at the ring's mean latitude (Snyder 1987 eq. 4-18 and 4-20, from memory),
 * then the shoelace formula. Exact to a few parts per million over a few kilometres.
 */
function ellipsoidPlanarM2(ring: readonly Position[]): number {
  const lat0 = ring.reduce((s, p) => s + p[1]!, 0) / ring.length;
  const sin = Math.sin(lat0 * RAD);
  const w = 1 - E2 * sin * sin;
  const m = (A * (1 - E2)) / w ** 1.5;
  const n = A / Math.sqrt(w);
  const xy = ring.map((p) => [p[0]! * RAD * n * Math.cos(lat0 * RAD), p[1]! * RAD * m] as const);
  let s = 0;
  for (let i = 0; i + 1 < xy.length; i++) s += xy[i]![0] * xy[i + 1]![1] - xy[i + 1]![0] * xy[i]![1];
  return Math.abs(s) / 2;
}

function square(lon: number, lat: number, side: number): Polygon {
  return { type: "Polygon", coordinates: [[[lon, lat], [lon + side, lat], [lon + side, lat + side], [lon, lat + side], [lon, lat]]] };
}

const url = (path = "") => `/api/v1/farms/${team.farmId}/fields${path}`;
const post = (body: Record<string, unknown>, as = team.manager) => call<Body>(fieldList.POST, url(), { method: "POST", as, params: { farmId: team.farmId }, body });
const patch = (id: string, body: Record<string, unknown>, as = team.manager) =>
  call<Body>(fieldItem.PATCH, url(`/${id}`), { method: "PATCH", as, params: { farmId: team.farmId, fieldId: id }, body });

beforeAll(async () => {
  team = await createFarmTeam();
  otherFarmId = (await db("memberships").where({ user_id: team.outsider.id }).first("farm_id")).farm_id;
  const soil = (farmId: string | null, name: string) => ({ farm_id: farmId, name, texture: "loam", theta_fc: 0.25, theta_wp: 0.12, theta_sat: 0.46 });
  [{ id: soilId }] = await db("soils").insert(soil(team.farmId, "Home loam")).returning("id");
  [{ id: librarySoilId }] = await db("soils").insert(soil(null, `Library loam ${suffix}`)).returning("id");
  [{ id: theirSoilId }] = await db("soils").insert(soil(otherFarmId, "Their loam")).returning("id");
  [{ id: theirSystemId }] = await db("irrigation_systems").insert({ farm_id: otherFarmId, name: "Their pivot", kind: "pivot", application_efficiency: 0.85 }).returning("id");
  [{ id: archivedGaugeId }] = await db("gauges").insert({ farm_id: team.farmId, name: "Old gauge", kind: "manual", archived_at: new Date() }).returning("id");
  [{ id: cropId }] = await db("crops")
    .insert({ farm_id: team.farmId, name: "Fixture cotton", kc_ini: 0.35, kc_mid: 1.15, kc_end: 0.6, stage_ini_days: 30, stage_dev_days: 50, stage_mid_days: 55, stage_late_days: 45, root_min_m: 0.15, root_max_m: 1.0, p: 0.65 })
    .returning("id");
});

afterAll(async () => {
  const g = globalThis as { rootbankBoss?: Promise<PgBoss> };
  if (g.rootbankBoss) await (await g.rootbankBoss).stop({ graceful: false, wait: true });
  const farms = [team.farmId, otherFarmId];
  await db("plantings").whereIn("field_id", db("fields").whereIn("farm_id", farms).select("id")).delete();
  await db("fields").whereIn("farm_id", farms).delete();
  await db("farms").whereIn("id", farms).delete();
  await db("soils").where({ id: librarySoilId }).delete();
  await db.destroy();
});

describe("field area and centroid", () => {
  it("measures a 0.01° square at the equator close to its area on the WGS84 ellipsoid", async () => {
    const res = await post({ name: `Equator ${suffix}`, boundary: square(0, 0, 0.01) });
    expect(res.status).toBe(201);
    const ellipsoidHa = ellipsoidQuadM2(0, 0.01, 0.01) / 10_000;
    // Snyder eq. 3-12 on WGS84 gives 123.09 ha (1.2309 km²); a sphere of the mean radius gives 123.64 ha.
    expect(ellipsoidHa).toBeCloseTo(123.09, 2);
    expect(Math.abs(res.body.field!.areaHa / ellipsoidHa - 1)).toBeLessThan(0.005);
    // What @turf/area computes: R² Δλ (sin φ2 − sin φ1) with the mean earth radius 6 371 008.8 m (IUGG, from memory).
    const sphereHa = (6_371_008.8 ** 2 * 0.01 * RAD * Math.sin(0.01 * RAD)) / 10_000;
    expect(res.body.field!.areaHa).toBeCloseTo(sphereHa, 3);
    expect(res.body.field!.centroidLat).toBeCloseTo(0.005, 9);
    expect(res.body.field!.centroidLon).toBeCloseTo(0.005, 9);
  });

  it("agrees with the ellipsoid to 0.05 % at the demo farms' latitude", async () => {
    const res = await post({ name: `Riverina ${suffix}`, boundary: square(146.03, -34.46, 0.01) });
    const ellipsoidHa = ellipsoidQuadM2(-34.46, -34.45, 0.01) / 10_000;
    expect(Math.abs(res.body.field!.areaHa / ellipsoidHa - 1)).toBeLessThan(0.0005);
  });

  it("takes a Feature, stores its geometry, and subtracts a MultiPolygon's hole from area and centroid", async () => {
    const outer = square(146, -34.5, 0.01).coordinates[0]!;
    const hole = [[146.0, -34.5], [146.0, -34.495], [146.005, -34.495], [146.005, -34.5], [146.0, -34.5]];
    const second = square(146.02, -34.5, 0.01).coordinates[0]!;
    const boundary = { type: "MultiPolygon", coordinates: [[outer, hole], [second]] };
    const res = await post({ name: `Holed ${suffix}`, boundary: { type: "Feature", properties: { from: "a map" }, geometry: boundary } });
    expect(res.status).toBe(201);
    expect(res.body.field!.boundary).toEqual(boundary);
    const expected = (ellipsoidPlanarM2(outer) - ellipsoidPlanarM2(hole) + ellipsoidPlanarM2(second)) / 10_000;
    expect(Math.abs(res.body.field!.areaHa / expected - 1)).toBeLessThan(0.001);
    // By hand, in quarter-squares: the first square weighs 4 (centre 146.005), its hole -1 (centre
    // 146.0025), the second square 4 (centre 146.025); the area-weighted mean of the centres.
    const lon = (4 * 146.005 - 146.0025 + 4 * 146.025) / 7;
    expect(res.body.field!.centroidLon).toBeCloseTo(lon, 5);
  });

  it("matches every seeded field's stored area to its boundary", async () => {
    const rows = buildDemo("2026-12-03", [KESTREL_BEND, IBIS_FLAT]).fields;
    expect(rows.length).toBeGreaterThan(5);
    for (const row of rows) {
      const boundary = JSON.parse(String(row.boundary)) as Polygon;
      const areaHa = Number(row.area_ha);
      // The seed rounds to 0.01 ha; the independent ellipsoid figure is held to 0.05 %.
      expect(Math.abs(boundaryAreaHa(boundary) - areaHa), String(row.name)).toBeLessThan(0.006);
      const ellipsoidHa = ellipsoidPlanarM2(boundary.coordinates[0]!) / 10_000;
      expect(Math.abs(areaHa / ellipsoidHa - 1), String(row.name)).toBeLessThan(0.0005);
      expect(boundarySchema.safeParse(boundary).success, String(row.name)).toBe(true);
    }
    const first = rows[0]!;
    const res = await post({ name: `Seeded ${suffix}`, boundary: JSON.parse(String(first.boundary)) });
    expect(res.body.field!.areaHa).toBeCloseTo(Number(first.area_ha), 2);
    expect(res.body.field!.centroidLat).toBeCloseTo(Number(first.centroid_lat), 4);
    expect(res.body.field!.centroidLon).toBeCloseTo(Number(first.centroid_lon), 4);
  });
});

describe("field boundaries that are refused", () => {
  const ring = square(146, -34.5, 0.01).coordinates[0]!;
  const cases: [string, string, unknown][] = [
    ["an open ring", "boundary.coordinates.0", { type: "Polygon", coordinates: [ring.slice(0, 4)] }],
    ["a ring of three positions", "boundary.coordinates.0", { type: "Polygon", coordinates: [[ring[0], ring[1], ring[0]]] }],
    ["a longitude past 180", "boundary.coordinates.0.0.0", { type: "Polygon", coordinates: [[[200, -34.5], ...ring.slice(1, 4), [200, -34.5]]] }],
    ["latitude and longitude swapped", "boundary.coordinates.0.0.1", { type: "Polygon", coordinates: [ring.map(([x, y]) => [y, x])] }],
    ["a line", "boundary.type", { type: "LineString", coordinates: ring }],
    ["a Feature of a point", "boundary.geometry.type", { type: "Feature", geometry: { type: "Point", coordinates: [146, -34.5] } }],
    ["corners on one line", "boundary", { type: "Polygon", coordinates: [[[146, -34.5], [146.01, -34.5], [146.02, -34.5], [146, -34.5]]] }],
    ["a bow tie", "boundary.coordinates.0", { type: "Polygon", coordinates: [[[146, -34.5], [146.01, -34.49], [146.01, -34.5], [146, -34.49], [146, -34.5]]] }],
    ["more positions than a field needs", "boundary", { type: "Polygon", coordinates: [Array.from({ length: 10_002 }, (_, i) => [146 + 0.01 * Math.cos((2 * Math.PI * i) / 10_001), -34.5 + 0.01 * Math.sin((2 * Math.PI * i) / 10_001)])] }],
    ["a position without latitude", "boundary.coordinates.0.0", { type: "Polygon", coordinates: [[[146], [146.01, -34.5], [146.01, -34.49], [146]]] }],
  ];
  it.each(cases)("%s (422 naming %s)", async (_label, path, boundary) => {
    const res = await post({ name: "Bad", boundary });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error!.fields ?? {})).toContain(path);
  });

  it("refuses an area sent beside a boundary, and a field with neither", async () => {
    const both = await post({ name: "Both", boundary: square(146, -34.5, 0.01), areaHa: 90 });
    expect(both.body.error!.fields).toHaveProperty("areaHa");
    const neither = await post({ name: "Neither" });
    expect(neither.body.error!.fields).toHaveProperty("boundary");
    const county = await post({ name: "County", boundary: square(140, -30, 5) });
    expect(county.status).toBe(422);
    expect(county.body.error!.fields!.boundary).toMatch(/100 000 ha/);
  });

  it("keeps a typed area when there is no boundary (no centroid)", async () => {
    const res = await post({ name: `Typed ${suffix}`, areaHa: 42.5, slopePct: 1.5, curveNumber: 78 });
    expect(res.status).toBe(201);
    expect(res.body.field).toMatchObject({ areaHa: 42.5, boundary: null, centroidLat: null, slopePct: 1.5, curveNumber: 78 });
    const bad = await post({ name: "Steep", areaHa: 10, slopePct: 120 });
    expect(bad.body.error!.fields).toHaveProperty("slopePct");
  });
});

describe("field references, roles and changes", () => {
  it("accepts the farm's and the library's soils, and names soil, system or gauge from elsewhere (422)", async () => {
    expect((await post({ name: `Lib ${suffix}`, areaHa: 5, soilId: librarySoilId })).status).toBe(201);
    const res = await post({ name: "Borrowed", areaHa: 5, soilId: theirSoilId, irrigationSystemId: theirSystemId, gaugeId: archivedGaugeId });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error!.fields!).sort()).toEqual(["gaugeId", "irrigationSystemId", "soilId"]);
    const unknown = await post({ name: "Ghost", areaHa: 5, soilId: randomUUID() });
    expect(unknown.body.error!.fields).toHaveProperty("soilId");
  });

  it("answers a repeated client id with the stored field (200), once", async () => {
    const id = randomUUID();
    const body = { id, name: `Offline ${suffix}`, boundary: square(146.1, -34.5, 0.005) };
    const a = await post(body);
    const b = await post(body);
    expect([a.status, b.status]).toEqual([201, 200]);
    expect(b.body.field).toEqual(a.body.field);
    expect(await db("audit_log").where({ entity: "field", entity_id: id }).count({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("lets only owners and managers write (403 for the others), strangers see nothing (404)", async () => {
    for (const as of [team.agronomist, team.worker, team.viewer]) expect((await post({ name: "No", areaHa: 1 }, as)).status).toBe(403);
    expect((await post({ name: "No", areaHa: 1 }, team.outsider)).status).toBe(404);
    const list = await call<Body>(fieldList.GET, url(), { as: team.viewer, params: { farmId: team.farmId } });
    expect(list.status).toBe(200);
    expect((await call(fieldList.GET, url(), { as: team.outsider, params: { farmId: team.farmId } })).status).toBe(404);
  });

  it("gives 404 for another farm's field under this farm's URL", async () => {
    const [{ id }] = await db("fields").insert({ farm_id: otherFarmId, name: "Theirs", area_ha: 3 }).returning("id");
    const params = { farmId: team.farmId, fieldId: id };
    expect((await call(fieldItem.GET, url(`/${id}`), { as: team.owner, params })).status).toBe(404);
    expect((await patch(id, { name: "Ours" }, team.owner)).status).toBe(404);
    expect((await call(fieldItem.DELETE, url(`/${id}`), { method: "DELETE", as: team.owner, params })).status).toBe(404);
    expect(await db("fields").where({ id }).first("name", "archived_at")).toEqual({ name: "Theirs", archived_at: null });
  });

  it("recomputes the area with a new boundary, refuses a typed area over a boundary", async () => {
    const made = await post({ name: `Redrawn ${suffix}`, boundary: square(146.2, -34.5, 0.01) });
    const id = made.body.field!.id;
    const res = await patch(id, { boundary: square(146.2, -34.5, 0.005) });
    expect(res.body.field!.areaHa / made.body.field!.areaHa).toBeCloseTo(0.25, 3);
    expect((await patch(id, { areaHa: 12 })).body.error!.fields).toHaveProperty("areaHa");
    const cleared = await patch(id, { boundary: null, areaHa: 26 });
    expect(cleared.body.field).toMatchObject({ boundary: null, areaHa: 26, centroidLat: null });
  });

  it("marks the account stale from the earliest planting when the soil changes, and audits it", async () => {
    const made = await post({ name: `Planted ${suffix}`, areaHa: 30, soilId });
    const id = made.body.field!.id;
    await db("plantings").insert([
      { field_id: id, season: "2025-26", crop_id: cropId, planting_date: "2025-10-20", end_date: "2026-04-01" },
      { field_id: id, season: "2026-27", crop_id: cropId, planting_date: "2026-10-18" },
    ]);
    const renamed = await patch(id, { name: `Planted north ${suffix}` });
    expect(renamed.body.field!.accountDirtyFrom).toBeNull();
    const res = await patch(id, { soilId: librarySoilId, slopePct: 2 });
    expect(res.status).toBe(200);
    expect(res.body.field).toMatchObject({ soilId: librarySoilId, accountDirtyFrom: "2025-10-20" });
    const audit = await db("audit_log").where({ entity: "field", entity_id: id }).orderBy("id").select("action", "user_id", "before", "after");
    expect(audit.map((a) => a.action)).toEqual(["create", "update", "update"]);
    expect(audit[2]).toMatchObject({ user_id: team.manager.id, before: { soilId, slopePct: null }, after: { soilId: librarySoilId, slopePct: 2 } });
  });

  it("archives a field: off the list, kept with includeArchived, audited", async () => {
    const made = await post({ name: `Sold ${suffix}`, areaHa: 8 });
    const id = made.body.field!.id;
    expect((await call(fieldItem.DELETE, url(`/${id}`), { method: "DELETE", as: team.owner, params: { farmId: team.farmId, fieldId: id } })).status).toBe(204);
    const list = await call<Body>(fieldList.GET, url("?limit=1000"), { as: team.viewer, params: { farmId: team.farmId } });
    expect(list.body.data!.map((f) => f.id)).not.toContain(id);
    const all = await call<Body>(fieldList.GET, url("?limit=1000&includeArchived=true"), { as: team.viewer, params: { farmId: team.farmId } });
    expect(all.body.data!.map((f) => f.id)).toContain(id);
    expect((await db("audit_log").where({ entity: "field", entity_id: id }).pluck("action")).sort()).toEqual(["archive", "create"]);
    // The name is free again for a new field.
    expect((await post({ name: `Sold ${suffix}`, areaHa: 8 })).status).toBe(201);
  });
});
