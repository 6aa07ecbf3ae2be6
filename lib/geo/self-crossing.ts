import type { Position } from "geojson";

interface Segment {
  i: number;
  ax: number;
  ay: number;
  bx: number;
  by: number;
  minX: number;
  maxX: number;
  minY: number;
  maxY: number;
}

/** Sign of the turn a → b → c: +1 anticlockwise, -1 clockwise, 0 on one line. */
function turn(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return Math.sign((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
}

/** True when the two segments cross at a point inside both (touching at an end is not a crossing). */
function crosses(s: Segment, t: Segment): boolean {
  const d1 = turn(s.ax, s.ay, s.bx, s.by, t.ax, t.ay);
  const d2 = turn(s.ax, s.ay, s.bx, s.by, t.bx, t.by);
  const d3 = turn(t.ax, t.ay, t.bx, t.by, s.ax, s.ay);
  const d4 = turn(t.ax, t.ay, t.bx, t.by, s.bx, s.by);
  return d1 * d2 < 0 && d3 * d4 < 0;
}

/**
 * The first pair of edges of a closed ring that cross each other, as edge indices, or null. A boundary
 * drawn as a bow tie has no single inside, so its area means nothing. Edges are swept in order of their
 * low end along the axis on which they are shortest in total, so only edges whose spans overlap on that
 * axis are compared: tens of ms for a 10 000-corner field outline; quadratic only for rings drawn to
 * defeat the sweep (about 1.5 s for a diagonal zigzag of 10 000 corners), which is why boundaries are
 * capped at MAX_BOUNDARY_POSITIONS and only owners and managers may send them.
 */
export function firstSelfCrossing(ring: readonly Position[]): [number, number] | null {
  const n = ring.length - 1;
  const segments: Segment[] = [];
  let spanX = 0;
  let spanY = 0;
  for (let i = 0; i < n; i++) {
    const [ax, ay] = ring[i] as [number, number];
    const [bx, by] = ring[i + 1] as [number, number];
    const s = { i, ax, ay, bx, by, minX: Math.min(ax, bx), maxX: Math.max(ax, bx), minY: Math.min(ay, by), maxY: Math.max(ay, by) };
    spanX += s.maxX - s.minX;
    spanY += s.maxY - s.minY;
    segments.push(s);
  }
  const alongX = spanX <= spanY;
  const lo = (s: Segment) => (alongX ? s.minX : s.minY);
  const hi = (s: Segment) => (alongX ? s.maxX : s.maxY);
  segments.sort((s, t) => lo(s) - lo(t));
  for (let a = 0; a < segments.length; a++) {
    const s = segments[a]!;
    const end = hi(s);
    for (let b = a + 1; b < segments.length && lo(segments[b]!) <= end; b++) {
      const t = segments[b]!;
      if (t.minY > s.maxY || t.maxY < s.minY || t.minX > s.maxX || t.maxX < s.minX) continue;
      const gap = Math.abs(s.i - t.i);
      // Neighbouring edges share a corner; the first and last edges share the closing corner.
      if (gap === 1 || gap === n - 1) continue;
      if (crosses(s, t)) return s.i < t.i ? [s.i, t.i] : [t.i, s.i];
    }
  }
  return null;
}
