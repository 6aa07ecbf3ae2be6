/**
 * Field boundaries of the two demo farms, drawn in metres on a local plane (x east, y north of a farm
 * origin) and turned into GeoJSON. Neighbouring paddocks are cut from one shared grid of corners and then
 * pulled a few metres in for the tracks between them, so no two boundaries overlap.
 */
import { area } from "@turf/area";
import type { Polygon } from "geojson";
import { round } from "./random";

export type Pt = readonly [number, number];

export interface Origin {
  latitude: number;
  longitude: number;
}

export interface FieldShape {
  key: string;
  name: string;
  boundary: Polygon;
  areaHa: number;
  centroidLat: number;
  centroidLon: number;
  /** Where the field sits on the local plane, for placing gauges and picking the nearest one. */
  centroidLocal: Pt;
}

/** Metres per degree on the WGS84 ellipsoid at the origin's latitude (adequate over a few kilometres). */
function metresPerDegree(latitude: number): { lat: number; lon: number } {
  const phi = (latitude * Math.PI) / 180;
  return {
    lat: 111_132.954 - 559.822 * Math.cos(2 * phi) + 1.175 * Math.cos(4 * phi),
    lon: 111_412.84 * Math.cos(phi) - 93.5 * Math.cos(3 * phi),
  };
}

/** Local metres to [longitude, latitude], as GeoJSON orders them. */
export function toLonLat(origin: Origin, p: Pt): [number, number] {
  const m = metresPerDegree(origin.latitude);
  return [round(origin.longitude + p[0] / m.lon, 6), round(origin.latitude + p[1] / m.lat, 6)];
}

function signedArea(ring: readonly Pt[]): number {
  let s = 0;
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % ring.length]!;
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

function centroid(ring: readonly Pt[]): Pt {
  const a = signedArea(ring);
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i]!;
    const q = ring[(i + 1) % ring.length]!;
    const cross = p[0] * q[1] - q[0] * p[1];
    cx += (p[0] + q[0]) * cross;
    cy += (p[1] + q[1]) * cross;
  }
  return [cx / (6 * a), cy / (6 * a)];
}

/** Pulls a ring towards its centroid so that each side moves in by roughly `metres` (farm tracks). */
function inset(ring: readonly Pt[], metres: number): Pt[] {
  const c = centroid(ring);
  const radius = Math.sqrt(Math.abs(signedArea(ring)) / Math.PI);
  const f = 1 - metres / radius;
  return ring.map((p) => [c[0] + (p[0] - c[0]) * f, c[1] + (p[1] - c[1]) * f] as const);
}

/** Keeps the part of a convex ring on the left of the line a -> b (one Sutherland-Hodgman pass). */
function clipLeftOf(ring: readonly Pt[], a: Pt, b: Pt): Pt[] {
  const side = (p: Pt) => (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]);
  const out: Pt[] = [];
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i]!;
    const q = ring[(i + 1) % ring.length]!;
    const sp = side(p);
    const sq = side(q);
    if (sp >= 0) out.push(p);
    if (sp * sq < 0) {
      const t = sp / (sp - sq);
      out.push([p[0] + (q[0] - p[0]) * t, p[1] + (q[1] - p[1]) * t]);
    }
  }
  return out;
}

/** The wetted circle of a centre pivot, as a 72-sided polygon. */
function circle(centre: Pt, radius: number): Pt[] {
  return Array.from({ length: 72 }, (_, i) => {
    const a = (2 * Math.PI * i) / 72;
    return [centre[0] + radius * Math.cos(a), centre[1] + radius * Math.sin(a)] as const;
  });
}

function shape(origin: Origin, key: string, name: string, ring: readonly Pt[]): FieldShape {
  // GeoJSON (RFC 7946) wants the outer ring anticlockwise.
  const ccw = signedArea(ring) < 0 ? [...ring].reverse() : [...ring];
  const coords = ccw.map((p) => toLonLat(origin, p));
  coords.push(coords[0]!);
  const boundary: Polygon = { type: "Polygon", coordinates: [coords] };
  const c = centroid(ccw);
  const [lon, lat] = toLonLat(origin, c);
  return {
    key,
    name,
    boundary,
    areaHa: round(area(boundary) / 10_000, 2),
    centroidLat: lat,
    centroidLon: lon,
    centroidLocal: c,
  };
}

/** Kestrel Bend's origin: where the supply channel's offtake meets Kestrel Bend Road. */
export const KESTREL_ORIGIN: Origin = { latitude: -34.452, longitude: 146.038 };

/**
 * Kestrel Bend: eight paddocks north of the road (two rows of four on a slightly skewed survey grid, the
 * north-east one cut by the supply channel), three river flats south of it down to the river bend.
 */
export function kestrelBendFields(): FieldShape[] {
  const o = KESTREL_ORIGIN;
  // Corners of the northern grid: columns lean east going north, rows rise gently to the east.
  const colX = [0, 560, 1420, 1960, 2760];
  const rowY = [40, 690, 1400];
  const corner = (c: number, r: number): Pt => {
    const y = rowY[r]! + 0.025 * colX[c]! + (c === 2 && r === 1 ? 18 : 0);
    return [colX[c]! + 0.06 * y - (c === 3 && r === 1 ? 25 : 0), y];
  };
  const cell = (c: number, r: number): Pt[] => [
    corner(c, r),
    corner(c + 1, r),
    corner(c + 1, r + 1),
    corner(c, r + 1),
  ];
  const cellCentre = (c: number, r: number): Pt => centroid(cell(c, r));
  const cellRadius = (c: number, r: number): number => {
    const ring = cell(c, r);
    const w = Math.min(ring[1]![0] - ring[0]![0], ring[2]![0] - ring[3]![0]);
    const h = Math.min(ring[3]![1] - ring[0]![1], ring[2]![1] - ring[1]![1]);
    return Math.min(w, h) / 2 - 20;
  };

  // The supply channel runs from the north boundary south-east to the offtake near the east road corner.
  const channelA: Pt = [2050, 1560];
  const channelB: Pt = [2900, 780];

  // River bank south of the road: a meander, sampled every 50 m.
  const riverY = (x: number) => -720 + 140 * Math.sin((x - 150) / 360) - 60 * Math.cos((x + 200) / 900);
  const southCols = [150, 1010, 1930, 2740];
  const southField = (i: number): Pt[] => {
    const x0 = southCols[i]!;
    const x1 = southCols[i + 1]!;
    const top = (x: number) => -40 + 0.025 * x;
    const ring: Pt[] = [
      [x1, top(x1)],
      [x0, top(x0)],
    ];
    for (let x = x0; x <= x1; x += 50) ring.push([x, riverY(x)]);
    if (ring[ring.length - 1]![0] !== x1) ring.push([x1, riverY(x1)]);
    return ring;
  };

  return [
    shape(o, "homestead", "Homestead", inset(cell(0, 0), 8)),
    shape(o, "pump-shed", "Pump Shed", circle(cellCentre(1, 0), cellRadius(1, 0))),
    shape(o, "long-bay", "Long Bay", inset(cell(2, 0), 8)),
    shape(o, "channel-corner", "Channel Corner", inset(cell(3, 0), 8)),
    shape(o, "ironbark", "Ironbark", inset(cell(0, 1), 8)),
    shape(o, "top-pivot", "Top Pivot", circle(cellCentre(1, 1), cellRadius(1, 1))),
    shape(o, "stony-rise", "Stony Rise", inset(cell(2, 1), 8)),
    shape(o, "kestrel-corner", "Kestrel Corner", inset(clipLeftOf(cell(3, 1), channelB, channelA), 10)),
    shape(o, "river-flat-1", "River Flat 1", inset(southField(0), 10)),
    shape(o, "river-flat-2", "River Flat 2", inset(southField(1), 10)),
    shape(o, "lagoon", "Lagoon", inset(southField(2), 10)),
  ];
}

/** Ibis Flat's origin, a smaller block about 27 km south-east of Kestrel Bend. */
export const IBIS_ORIGIN: Origin = { latitude: -34.588, longitude: 146.301 };

/** Ibis Flat: three paddocks in a row along its lane. */
export function ibisFlatFields(): FieldShape[] {
  const o = IBIS_ORIGIN;
  const xs = [0, 430, 1020, 1400];
  const corner = (i: number, top: boolean): Pt => [xs[i]! + (top ? 35 : 0), top ? 520 - 0.04 * xs[i]! : 30];
  const paddock = (i: number): Pt[] =>
    inset([corner(i, false), corner(i + 1, false), corner(i + 1, true), corner(i, true)], 8);
  return [
    shape(o, "spoonbill", "Spoonbill", paddock(0)),
    shape(o, "reedbed", "Reedbed", paddock(1)),
    shape(o, "back-paddock", "Back Paddock", paddock(2)),
  ];
}

/** A point of the local plane as latitude and longitude, for gauges and stations. */
export function placeAt(origin: Origin, p: Pt): { latitude: number; longitude: number } {
  const [longitude, latitude] = toLonLat(origin, p);
  return { latitude, longitude };
}
