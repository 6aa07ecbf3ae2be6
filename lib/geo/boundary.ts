import { area } from "@turf/area";
import type { MultiPolygon, Polygon, Position } from "geojson";
import { z } from "zod";
import { firstSelfCrossing } from "./self-crossing";

/** A field's outline: GeoJSON (RFC 7946) Polygon or MultiPolygon, lon/lat in WGS84 degrees. */
export type Boundary = Polygon | MultiPolygon;

const position = z
  .array(z.number({ error: "A position is [longitude, latitude] in decimal degrees" }))
  .min(2, "A position is [longitude, latitude] in decimal degrees")
  .max(3, "A position is [longitude, latitude] or [longitude, latitude, height]");
const ring = z.array(position, { error: "A ring is a list of [longitude, latitude] positions" });
const polygonCoordinates = z.array(ring).min(1, "A polygon needs an outer ring");

const polygon = z.object({ type: z.literal("Polygon"), coordinates: polygonCoordinates });
const multiPolygon = z.object({
  type: z.literal("MultiPolygon"),
  coordinates: z.array(polygonCoordinates).min(1, "A MultiPolygon needs at least one polygon"),
});
const geometry = z.discriminatedUnion("type", [polygon, multiPolygon], {
  error: "A boundary is a GeoJSON Polygon or MultiPolygon geometry, or a Feature holding one",
});
const feature = z.object({ type: z.literal("Feature"), geometry, properties: z.unknown().optional() });

type Issue = { code: "custom"; message: string; path: (string | number)[] };

/** More corners than any surveyed or walked field needs; a bound on the work one request may ask for. */
export const MAX_BOUNDARY_POSITIONS = 10_000;

/** Positions in range, rings of four or more positions that close without crossing themselves. */
function checkRings(geom: Boundary, prefix: (string | number)[], addIssue: (issue: Issue) => void): void {
  const polygons: Position[][][] = geom.type === "Polygon" ? [geom.coordinates] : geom.coordinates;
  const count = polygons.reduce((sum, rings) => sum + rings.reduce((s, r) => s + r.length, 0), 0);
  if (count > MAX_BOUNDARY_POSITIONS) {
    addIssue({ code: "custom", message: `A boundary may have at most ${MAX_BOUNDARY_POSITIONS} positions; simplify it`, path: prefix });
    return;
  }
  polygons.forEach((rings, p) => {
    rings.forEach((r, i) => {
      const at = [...prefix, "coordinates", ...(geom.type === "Polygon" ? [] : [p]), i];
      r.forEach((pos, j) => {
        const [lon, lat] = pos as [number, number];
        if (!Number.isFinite(lon) || lon < -180 || lon > 180) {
          addIssue({ code: "custom", message: "Longitude must be between -180 and 180 (GeoJSON puts longitude first)", path: [...at, j, 0] });
        }
        if (!Number.isFinite(lat) || lat < -90 || lat > 90) {
          addIssue({ code: "custom", message: "Latitude must be between -90 and 90 (GeoJSON puts latitude second)", path: [...at, j, 1] });
        }
      });
      if (r.length < 4) {
        addIssue({ code: "custom", message: "A ring needs at least 4 positions: 3 corners and the first one repeated to close it", path: at });
        return;
      }
      const first = r[0]!;
      const last = r[r.length - 1]!;
      if (first[0] !== last[0] || first[1] !== last[1]) {
        addIssue({ code: "custom", message: "A ring must close: repeat its first position as its last", path: at });
        return;
      }
      const crossing = firstSelfCrossing(r);
      if (crossing) {
        addIssue({
          code: "custom",
          message: `The boundary crosses itself (edges ${crossing[0] + 1} and ${crossing[1] + 1}); redraw it so no two edges cross`,
          path: at,
        });
      }
    });
  });
}

/**
 * A field boundary as the API takes it: a Polygon or MultiPolygon geometry, or a Feature of one (as map
 * tools and KML/shapefile converters write them). Always comes out as the bare geometry.
 */
export const boundarySchema = z
  .discriminatedUnion("type", [polygon, multiPolygon, feature], {
    error: "A boundary is a GeoJSON Polygon or MultiPolygon geometry, or a Feature holding one",
  })
  .superRefine((value, ctx) => {
    const geom = value.type === "Feature" ? value.geometry : value;
    const before = ctx.issues.length;
    checkRings(geom, value.type === "Feature" ? ["geometry"] : [], (issue) => ctx.addIssue(issue));
    if (ctx.issues.length === before && boundaryAreaHa(geom) <= 0) {
      ctx.addIssue({ code: "custom", message: "The boundary encloses no area: its corners lie on one line", path: [] });
    }
  })
  .transform((value): Boundary => (value.type === "Feature" ? value.geometry : value));

/**
 * Area inside a boundary, hectares. @turf/area works on a sphere of the mean earth radius (6 371 008.8 m);
 * against the WGS84 ellipsoid that overstates areas by 0.45 % at the equator, agrees within 0.02 % at
 * 34° latitude and understates by 0.2 % at 45° and 0.56 % at 60° (tests/integration/setup-fields.test.ts),
 * well inside the accuracy of a drawn or walked boundary.
 */
export function boundaryAreaHa(boundary: Boundary): number {
  return area(boundary) / 10_000;
}

/**
 * The area-weighted centroid of a boundary (holes subtracted), computed on a local equirectangular plane
 * about its first position: at field scale that plane distorts less than a GPS fix errs.
 */
export function boundaryCentroid(boundary: Boundary): { latitude: number; longitude: number } {
  const polygons: Position[][][] = boundary.type === "Polygon" ? [boundary.coordinates] : boundary.coordinates;
  const origin = polygons[0]?.[0]?.[0];
  if (!origin) throw new Error("empty boundary");
  const [lon0, lat0] = origin as [number, number];
  const kx = Math.cos((lat0 * Math.PI) / 180);
  let sumA = 0;
  let sumX = 0;
  let sumY = 0;
  for (const rings of polygons) {
    rings.forEach((r, i) => {
      let a = 0;
      let cx = 0;
      let cy = 0;
      for (let j = 0; j + 1 < r.length; j++) {
        const x1 = (r[j]![0]! - lon0) * kx;
        const y1 = r[j]![1]! - lat0;
        const x2 = (r[j + 1]![0]! - lon0) * kx;
        const y2 = r[j + 1]![1]! - lat0;
        const cross = x1 * y2 - x2 * y1;
        a += cross;
        cx += (x1 + x2) * cross;
        cy += (y1 + y2) * cross;
      }
      // Outer rings add, holes subtract, whichever way round each was drawn.
      const sign = (i === 0 ? 1 : -1) * Math.sign(a);
      sumA += sign * (a / 2);
      sumX += sign * (cx / 6);
      sumY += sign * (cy / 6);
    });
  }
  if (sumA === 0) return { latitude: lat0, longitude: lon0 };
  return { latitude: lat0 + sumY / sumA, longitude: lon0 + sumX / sumA / kx };
}
