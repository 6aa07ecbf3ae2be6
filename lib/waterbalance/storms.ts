import {
  float64Columns,
  scratchFloat64,
  SCRATCH_PIECE_DEPTH,
  SCRATCH_PIECE_END,
  SCRATCH_PIECE_START,
  SCRATCH_TIP_DEPTH,
  SCRATCH_TIP_MS,
} from "./arrays";
import { requireNonNegative, requirePositive, WaterBalanceInputError } from "./errors";

/**
 * Time-stamped rain: bucket tips and logger intervals into a hyetograph, and storms separated by a
 * dry gap. The hyetograph is held in columns (typed arrays) so a season of tips makes no object per
 * tip; the piece-object forms are kept for callers that want them.
 */

/** One time-stamped catch: a bucket tip, or the depth a logger recorded over an interval. */
export interface RainRecord {
  /** end of the catch: the tip's instant, or the end of the logger interval (ISO UTC string or epoch ms) */
  at: string | number;
  /** depth caught, mm (the bucket's resolution for a tip, e.g. 0.2) */
  depthMm: number;
  /** logger interval, minutes; leave out for bucket tips */
  intervalMin?: number;
}

/** A stretch of constant intensity: `depthMm` fell evenly from `startMs` to `endMs` (epoch ms). */
export interface HyetographPiece {
  startMs: number;
  endMs: number;
  depthMm: number;
}

/** A hyetograph in columns: piece k fell evenly from startMs[k] to endMs[k]; pieces are in time order and do not overlap. */
export interface HyetographColumns {
  n: number;
  startMs: Float64Array;
  endMs: Float64Array;
  depthMm: Float64Array;
}

/** A storm: pieces with no dry gap as long as the separation gap between them. */
export interface Storm {
  startMs: number;
  endMs: number;
  depthMm: number;
  pieces: HyetographPiece[];
}

/** Options for turning records into a hyetograph. */
export interface HyetographOptions {
  /**
   * Longest time one tip's rain is spread over, minutes (default 60, common practice, no source): a tip
   * after a long quiet spell is taken to hold rain that fell in the last hour, not since the last tip.
   */
  maxTipIntervalMin?: number;
  /** Tips closer than this to the previous one are switch bounce and dropped, ms (default 1000). */
  debounceMs?: number;
}

/** Epoch milliseconds of an instant given as ISO string or epoch ms; throws on an unreadable instant. */
export function toEpochMs(at: string | number, field = "at"): number {
  const ms = typeof at === "number" ? at : Date.parse(at);
  if (!Number.isFinite(ms))
    throw new WaterBalanceInputError(field, `is not a readable instant (${String(at)})`);
  return ms;
}

/**
 * Builds a hyetograph in columns from time-stamped records. A tip's intensity comes from the time
 * since the previous tip (its bucket filled over that time), not from fixed clock windows; the first
 * tip of a burst takes the interval of the tip after it, and no tip is spread over more than
 * `maxTipIntervalMin`. Logger intervals spread their depth evenly; overlaps are clipped.
 * @returns the columns and how many tips were dropped as switch bounce
 */
export function hyetographColumns(
  records: readonly RainRecord[],
  options: HyetographOptions = {},
): { hyetograph: HyetographColumns; droppedTips: number } {
  const capMs = requirePositive("maxTipIntervalMin", options.maxTipIntervalMin ?? 60) * 60_000;
  const debounceMs = requireNonNegative("debounceMs", options.debounceMs ?? 1000);
  const m = records.length;
  let tipMs = scratchFloat64(SCRATCH_TIP_MS, m);
  let tipDepth = scratchFloat64(SCRATCH_TIP_DEPTH, m);
  let nt = 0;
  let sorted = true;
  let intervals: HyetographPiece[] | null = null;
  for (let k = 0; k < m; k++) {
    const r = records[k]!;
    const depth = r.depthMm;
    if (!(depth >= 0) || depth === Infinity) requireNonNegative("depthMm", depth);
    const at = r.at;
    const ms = typeof at === "number" && Number.isFinite(at) ? at : toEpochMs(at);
    if (depth === 0) continue;
    if (r.intervalMin === undefined) {
      if (nt > 0 && ms < tipMs[nt - 1]!) sorted = false;
      tipMs[nt] = ms;
      tipDepth[nt] = depth;
      nt++;
    } else {
      (intervals ??= []).push({
        startMs: ms - requirePositive("intervalMin", r.intervalMin) * 60_000,
        endMs: ms,
        depthMm: depth,
      });
    }
  }
  if (!sorted) {
    const order = Array.from({ length: nt }, (_, i) => i).sort((a, b) => tipMs[a]! - tipMs[b]! || a - b);
    const ms2 = new Float64Array(nt);
    const d2 = new Float64Array(nt);
    for (let i = 0; i < nt; i++) {
      ms2[i] = tipMs[order[i]!]!;
      d2[i] = tipDepth[order[i]!]!;
    }
    tipMs = ms2;
    tipDepth = d2;
  }
  // drop switch bounce in place
  let kept = 0;
  let droppedTips = 0;
  for (let k = 0; k < nt; k++) {
    if (kept > 0 && tipMs[k]! - tipMs[kept - 1]! < debounceMs) {
      droppedTips++;
      continue;
    }
    tipMs[kept] = tipMs[k]!;
    tipDepth[kept] = tipDepth[k]!;
    kept++;
  }
  if (intervals === null) {
    const [startMs, endMs, depthMm] = float64Columns(Math.max(1, kept), 3) as [
      Float64Array,
      Float64Array,
      Float64Array,
    ];
    writeTipPieces(tipMs, tipDepth, kept, capMs, startMs, endMs, depthMm, 0);
    return { hyetograph: { n: kept, startMs, endMs, depthMm }, droppedTips };
  }
  // logger intervals (perhaps with tips): merge as objects, then to columns
  const tipStart = new Float64Array(kept);
  const tipEnd = new Float64Array(kept);
  const tipD = new Float64Array(kept);
  writeTipPieces(tipMs, tipDepth, kept, capMs, tipStart, tipEnd, tipD, 0);
  const raw = intervals;
  for (let k = 0; k < kept; k++) raw.push({ startMs: tipStart[k]!, endMs: tipEnd[k]!, depthMm: tipD[k]! });
  raw.sort((a, b) => a.startMs - b.startMs || a.endMs - b.endMs);
  const merged: HyetographPiece[] = [];
  for (const p of raw) {
    const last = merged[merged.length - 1];
    if (last && p.startMs < last.endMs) {
      // overlapping intervals: keep the later part, or fold a fully covered one into its neighbour
      if (p.endMs <= last.endMs) last.depthMm += p.depthMm;
      else merged.push({ startMs: last.endMs, endMs: p.endMs, depthMm: p.depthMm });
      continue;
    }
    merged.push({ startMs: p.startMs, endMs: p.endMs, depthMm: p.depthMm });
  }
  return { hyetograph: piecesToColumns(merged), droppedTips };
}

function writeTipPieces(
  tipMs: Float64Array,
  tipDepth: Float64Array,
  kept: number,
  capMs: number,
  startMs: Float64Array,
  endMs: Float64Array,
  depthMm: Float64Array,
  at: number,
): void {
  for (let k = 0; k < kept; k++) {
    const t = tipMs[k]!;
    let spanMs = k > 0 ? t - tipMs[k - 1]! : Infinity;
    if (spanMs > capMs) {
      const nextSpan = k + 1 < kept ? tipMs[k + 1]! - t : Infinity;
      spanMs = nextSpan < capMs ? nextSpan : capMs;
    }
    startMs[at + k] = t - spanMs;
    endMs[at + k] = t;
    depthMm[at + k] = tipDepth[k]!;
  }
}

/** Piece objects into fresh columns. */
export function piecesToColumns(pieces: readonly HyetographPiece[]): HyetographColumns {
  return fillColumns(pieces, float64Columns(Math.max(1, pieces.length), 3));
}

/**
 * Piece objects into the module's reusable scratch columns, for a wrapper that uses them at once and
 * lets go (the next call overwrites them).
 */
export function piecesToScratchColumns(pieces: readonly HyetographPiece[]): HyetographColumns {
  const n = pieces.length;
  return fillColumns(pieces, [
    scratchFloat64(SCRATCH_PIECE_START, n),
    scratchFloat64(SCRATCH_PIECE_END, n),
    scratchFloat64(SCRATCH_PIECE_DEPTH, n),
  ]);
}

function fillColumns(pieces: readonly HyetographPiece[], target: Float64Array[]): HyetographColumns {
  const n = pieces.length;
  const startMs = target[0]!;
  const endMs = target[1]!;
  const depthMm = target[2]!;
  for (let k = 0; k < n; k++) {
    const p = pieces[k]!;
    startMs[k] = p.startMs;
    endMs[k] = p.endMs;
    depthMm[k] = p.depthMm;
  }
  return { n, startMs, endMs, depthMm };
}

/** Columns `from`..`to` (exclusive) as piece objects. */
export function columnsToPieces(h: HyetographColumns, from = 0, to = h.n): HyetographPiece[] {
  const out = new Array<HyetographPiece>(to - from);
  for (let k = from; k < to; k++)
    out[k - from] = { startMs: h.startMs[k]!, endMs: h.endMs[k]!, depthMm: h.depthMm[k]! };
  return out;
}

/**
 * Builds a hyetograph from time-stamped records, as piece objects (see {@link hyetographColumns}).
 * @returns pieces in time order, and how many tips were dropped as bounce
 */
export function buildHyetograph(
  records: readonly RainRecord[],
  options: HyetographOptions = {},
): { pieces: HyetographPiece[]; droppedTips: number } {
  const { hyetograph, droppedTips } = hyetographColumns(records, options);
  return { pieces: columnsToPieces(hyetograph), droppedTips };
}

/**
 * Storm boundaries in a columnar hyetograph: a new storm starts after a rainless gap of at least
 * `dryGapH` hours (default 6, common practice for runoff and erosivity storms; configurable).
 * @returns [from, to) index pairs, flattened: [from0, to0, from1, to1, …]
 */
export function stormBounds(h: HyetographColumns, dryGapH = 6): number[] {
  const gapMs = requirePositive("dryGapH", dryGapH) * 3_600_000;
  const out: number[] = [];
  let from = 0;
  let end = -Infinity;
  for (let k = 0; k < h.n; k++) {
    if (k > 0 && h.startMs[k]! - end >= gapMs) {
      out.push(from, k);
      from = k;
    }
    if (h.endMs[k]! > end) end = h.endMs[k]!;
  }
  if (h.n > 0) out.push(from, h.n);
  return out;
}

/** Splits piece objects into storms at dry gaps of at least `dryGapH` hours (default 6). */
export function separateStorms(
  pieces: readonly HyetographPiece[],
  options: { dryGapH?: number } = {},
): Storm[] {
  const gapMs = requirePositive("dryGapH", options.dryGapH ?? 6) * 3_600_000;
  const storms: Storm[] = [];
  let cur: Storm | null = null;
  for (const p of pieces) {
    if (!cur || p.startMs - cur.endMs >= gapMs) {
      cur = { startMs: p.startMs, endMs: p.endMs, depthMm: 0, pieces: [] };
      storms.push(cur);
    }
    cur.pieces.push(p);
    cur.depthMm += p.depthMm;
    if (p.endMs > cur.endMs) cur.endMs = p.endMs;
  }
  return storms;
}

/** Records to storms in one step ({@link buildHyetograph} then {@link separateStorms}). */
export function stormsFromRecords(
  records: readonly RainRecord[],
  options: HyetographOptions & { dryGapH?: number } = {},
): { storms: Storm[]; droppedTips: number } {
  const { pieces, droppedTips } = buildHyetograph(records, options);
  return { storms: separateStorms(pieces, options), droppedTips };
}
