/**
 * Field boundaries from GeoJSON, KML (@tmcw/togeojson on @xmldom/xmldom) and zipped shapefiles (shpjs,
 * which also reprojects to WGS 84 when the .prj names another system). Each polygon feature is matched
 * to a field by name; the field's area and centroid follow from its boundary.
 */
import area from "@turf/area";
import { kml } from "@tmcw/togeojson";
import { DOMParser } from "@xmldom/xmldom";
import type { Feature, Geometry, MultiPolygon, Polygon, Position } from "geojson";
import { AppError } from "@/lib/api/errors";
import type { BoundaryOptions } from "./options";
import { ProblemList } from "./report";

export type BoundaryFormat = "geojson" | "kml" | "shapefile";

export interface BoundaryInput {
  line: number;
  name: string;
  boundary: Polygon | MultiPolygon;
  areaHa: number;
  centroidLat: number;
  centroidLon: number;
}

/** The format from the option, else the file name's extension, else the first bytes. */
export function detectFormat(fileName: string, bytes: Uint8Array, format?: BoundaryFormat): BoundaryFormat {
  if (format) return format;
  const lower = fileName.toLowerCase();
  if (lower.endsWith(".zip")) return "shapefile";
  if (lower.endsWith(".kml")) return "kml";
  if (lower.endsWith(".geojson") || lower.endsWith(".json")) return "geojson";
  if (bytes[0] === 0x50 && bytes[1] === 0x4b) return "shapefile"; // "PK", a zip archive
  const head = new TextDecoder().decode(bytes.slice(0, 200)).trimStart();
  if (head.startsWith("<")) return "kml";
  if (head.startsWith("{")) return "geojson";
  throw new AppError("invalid", "The boundary file is not GeoJSON, KML or a zipped shapefile.", {
    "options.format": "Say which format the file is",
  });
}

async function readFeatures(bytes: Uint8Array, format: BoundaryFormat): Promise<Feature<Geometry | null>[]> {
  try {
    if (format === "geojson") {
      const json = JSON.parse(new TextDecoder().decode(bytes)) as {
        type?: string;
        features?: unknown;
        geometry?: unknown;
      };
      if (json.type === "FeatureCollection" && Array.isArray(json.features))
        return json.features as Feature<Geometry | null>[];
      if (json.type === "Feature") return [json as Feature<Geometry | null>];
      return [{ type: "Feature", properties: {}, geometry: json as Geometry }];
    }
    if (format === "kml") {
      const doc = new DOMParser().parseFromString(new TextDecoder().decode(bytes), "text/xml");
      return kml(doc).features;
    }
    // Loaded when needed, and as an ES module: required as CommonJS (the worker under tsx), shpjs hands
    // over its browser bundle, which needs `self`.
    const { default: shp } = await import("shpjs");
    const parsed = await shp(Buffer.from(bytes));
    return (Array.isArray(parsed) ? parsed : [parsed]).flatMap((c) => c.features);
  } catch (err) {
    if (err instanceof AppError) throw err;
    throw new AppError(
      "invalid",
      `The file could not be read as ${format}: ${err instanceof Error ? err.message : "unknown error"}.`,
      { file: "Unreadable" },
    );
  }
}

function isPosition(p: unknown): p is Position {
  return (
    Array.isArray(p) &&
    p.length >= 2 &&
    typeof p[0] === "number" &&
    typeof p[1] === "number" &&
    Number.isFinite(p[0]) &&
    Number.isFinite(p[1]) &&
    Math.abs(p[0]) <= 180 &&
    Math.abs(p[1]) <= 90
  );
}

/** A polygon's rings in two dimensions, or the reason they are not a polygon. */
function cleanPolygon(rings: unknown): Position[][] | string {
  if (!Array.isArray(rings) || rings.length === 0) return "a polygon needs at least one ring";
  const out: Position[][] = [];
  for (const ring of rings as unknown[]) {
    if (!Array.isArray(ring) || ring.length < 4) return "a ring needs at least four positions";
    if (!ring.every(isPosition)) return "a position is not a longitude and latitude in degrees";
    const flat = (ring as Position[]).map((p) => [p[0] as number, p[1] as number]);
    const [first, last] = [flat[0], flat[flat.length - 1]];
    if (!first || !last || first[0] !== last[0] || first[1] !== last[1]) return "a ring is not closed";
    out.push(flat);
  }
  return out;
}

function centroidOf(rings: Position[][]): [number, number] {
  const outer = rings[0] ?? [];
  const pts = outer.slice(0, -1);
  const lon = pts.reduce((s, p) => s + (p[0] ?? 0), 0) / Math.max(1, pts.length);
  const lat = pts.reduce((s, p) => s + (p[1] ?? 0), 0) / Math.max(1, pts.length);
  return [lat, lon];
}

/** Reads the features of a boundary file and checks each; feature numbers stand in for lines. */
export async function parseBoundaries(
  fileName: string,
  bytes: Uint8Array,
  o: BoundaryOptions,
): Promise<{ boundaries: BoundaryInput[]; problems: ProblemList; rows: number; format: BoundaryFormat }> {
  const format = detectFormat(fileName, bytes, o.format);
  const features = await readFeatures(bytes, format);
  const problems = new ProblemList();
  const seen = new Map<string, number>();
  const boundaries: BoundaryInput[] = [];
  features.forEach((feature, i) => {
    const line = i + 1;
    const rawName = feature.properties?.[o.nameProperty];
    const name = typeof rawName === "string" || typeof rawName === "number" ? String(rawName).trim() : "";
    if (!name) problems.add({ line, column: o.nameProperty, reason: "no name to match a field" });
    const g = feature.geometry;
    let boundary: Polygon | MultiPolygon | null = null;
    let rings: Position[][] = [];
    if (!g || (g.type !== "Polygon" && g.type !== "MultiPolygon")) {
      problems.add({ line, column: "geometry", value: g?.type ?? "none", reason: "not a polygon" });
    } else if (g.type === "Polygon") {
      const clean = cleanPolygon(g.coordinates);
      if (typeof clean === "string") problems.add({ line, column: "geometry", reason: clean });
      else [boundary, rings] = [{ type: "Polygon", coordinates: clean }, clean];
    } else {
      const parts = g.coordinates.map(cleanPolygon);
      const bad = parts.find((p): p is string => typeof p === "string");
      if (bad) problems.add({ line, column: "geometry", reason: bad });
      else
        [boundary, rings] = [
          { type: "MultiPolygon", coordinates: parts as Position[][][] },
          (parts[0] as Position[][]) ?? [],
        ];
    }
    const earlier = seen.get(name.toLowerCase());
    if (name && earlier !== undefined)
      problems.add({
        line,
        column: o.nameProperty,
        value: name,
        reason: `the same name as feature ${earlier}`,
      });
    if (!boundary || problems.has(line)) return;
    const areaHa = area(boundary) / 10_000;
    // The fields table's own limits: a field has some area and is smaller than a county.
    if (!(areaHa > 0) || areaHa > 100_000) {
      problems.add({
        line,
        column: "geometry",
        value: `${areaHa.toFixed(2)} ha`,
        reason: "area must be above 0 and at most 100 000 ha",
      });
      return;
    }
    seen.set(name.toLowerCase(), line);
    const [centroidLat, centroidLon] = centroidOf(rings);
    boundaries.push({ line, name, boundary, areaHa, centroidLat, centroidLon });
  });
  return { boundaries, problems, rows: features.length, format };
}
