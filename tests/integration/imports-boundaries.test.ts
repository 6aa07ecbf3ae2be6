/**
 * Field boundaries from GeoJSON, KML and a zipped shapefile: the same square block gives the same area
 * from each, matched to the field by name; broken features are reported by number.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import * as importsRoute from "@/app/api/v1/farms/[farmId]/imports/route";
import { queue } from "@/lib/jobs/queue";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";
import { fixture, upload } from "../fixtures/imports/upload";
import { zippedShapefile } from "../fixtures/imports/shapefile";

interface ImportBody {
  status: string;
  counts: { rows: number; rejected: number; inserted: number; updated: number; unchanged: number };
  report: { unit: string; rejected: { line: number; column: string; reason: string }[] };
}

/**
 * The area of the fixture's block (146.00-146.01 °E, 34.40-34.41 °S) on a sphere: A = R² Δλ |sin φ₁ − sin φ₂|
 * (area of a latitude-longitude cell, spherical geometry), with R = 6 371 008.8 m, the mean Earth radius
 * (IUGG) that @turf/area also uses; from memory.
 */
const R = 6_371_008.8;
const rad = (d: number) => (d * Math.PI) / 180;
const EXPECTED_HA = (R * R * rad(0.01) * Math.abs(Math.sin(rad(-34.4)) - Math.sin(rad(-34.41)))) / 10_000;

let team: FarmTeam;

beforeAll(async () => {
  team = await createFarmTeam();
  await db("fields").insert({ farm_id: team.farmId, name: "River Block", area_ha: 50 });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

async function block() {
  return db("fields").where({ farm_id: team.farmId }).whereRaw("lower(name) = 'river block'").first();
}

describe("boundary files", () => {
  it("needs the editSetup capability: a worker may log rain but not move fields", async () => {
    const res = await upload(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "square.geojson", data: fixture("square.geojson") },
      "boundaries",
      {},
    );
    expect(res.status).toBe(403);
  });

  it("reports broken features by number and writes nothing when any is rejected", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.manager,
      { name: "square.geojson", data: fixture("square.geojson") },
      "boundaries",
      {},
    );
    expect(res.body.status).toBe("rejected");
    expect(res.body.report.unit).toBe("feature");
    expect(res.body.report.rejected).toEqual([
      { line: 2, column: "geometry", value: "LineString", reason: "not a polygon" },
      { line: 3, column: "name", reason: "no name to match a field" },
      { line: 4, column: "geometry", reason: "a ring is not closed" },
    ]);
    expect((await block()).boundary).toBeNull();
  });

  it("GeoJSON: sets the matching field's boundary, area and centroid", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.manager,
      { name: "square.geojson", data: fixture("square.geojson") },
      "boundaries",
      { writeGoodRows: true },
    );
    expect(res.body.status).toBe("done");
    expect(res.body.counts).toMatchObject({ inserted: 0, updated: 1 });
    const field = await block();
    expect(field.name).toBe("River Block"); // matched without regard to case; the field keeps its name
    expect(field.area_ha).toBeCloseTo(EXPECTED_HA, 1);
    expect(Math.abs(field.area_ha - EXPECTED_HA) / EXPECTED_HA).toBeLessThan(1e-3);
    expect(field.centroid_lat).toBeCloseTo(-34.405, 6);
    expect(field.centroid_lon).toBeCloseTo(146.005, 6);
    expect(field.boundary.type).toBe("Polygon");
  });

  it("KML: the same block, the same area, and nothing changes", async () => {
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.owner,
      { name: "square.kml", data: fixture("square.kml") },
      "boundaries",
      {},
    );
    expect(res.body.status).toBe("done");
    // KML's altitudes are dropped, so the boundary equals the GeoJSON one and the field is unchanged.
    expect(res.body.counts).toMatchObject({ inserted: 0, updated: 0, unchanged: 1 });
    expect((await block()).area_ha).toBeCloseTo(EXPECTED_HA, 1);
  });

  it("zipped shapefile: the same block, plus a new field for a name that matches none", async () => {
    const zip = zippedShapefile([
      {
        name: "River block",
        ring: [
          [146.0, -34.4],
          [146.01, -34.4],
          [146.01, -34.41],
          [146.0, -34.41],
          [146.0, -34.4],
        ],
      },
      {
        name: "Top paddock",
        ring: [
          [146.02, -34.4],
          [146.03, -34.4],
          [146.03, -34.41],
          [146.02, -34.41],
          [146.02, -34.4],
        ],
      },
    ]);
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.owner,
      { name: "blocks.zip", data: zip },
      "boundaries",
      {},
    );
    expect(res.body.status).toBe("done");
    expect(res.body.counts).toMatchObject({ rows: 2, inserted: 1, unchanged: 1 });
    expect((await block()).area_ha).toBeCloseTo(EXPECTED_HA, 1);
    const top = await db("fields").where({ farm_id: team.farmId, name: "Top paddock" }).first();
    // the same size of cell at the same latitudes, 0.02° further east
    expect(top.area_ha).toBeCloseTo(EXPECTED_HA, 1);
    expect(top.created_by).toBe(team.owner.id);
  });

  it("refuses a name that matches no field when creating is turned off", async () => {
    const geo = JSON.stringify({
      type: "Feature",
      properties: { name: "Nowhere" },
      geometry: {
        type: "Polygon",
        coordinates: [
          [
            [146.1, -34.4],
            [146.11, -34.4],
            [146.11, -34.41],
            [146.1, -34.4],
          ],
        ],
      },
    });
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.owner,
      { name: "one.json", data: geo },
      "boundaries",
      { createMissing: false },
    );
    expect(res.body.status).toBe("rejected");
    expect(res.body.report.rejected).toEqual([
      { line: 1, column: "name", value: "Nowhere", reason: "no field of this farm has this name" },
    ]);
  });
});
