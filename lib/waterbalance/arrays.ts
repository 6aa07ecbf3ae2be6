/**
 * Typed-array allocation for the hot paths. Creating a typed array of a season's length costs
 * microseconds (a zeroed off-heap store, counted against the heap), which a 2,000-field recompute
 * feels; so columns are carved from shared 1 MB slabs, and short-lived working arrays are reused.
 * A column keeps its slab alive while it is reachable (at most 1 MB per retained season).
 */

const SLAB_BYTES = 1 << 20;
let slab: ArrayBuffer | null = null;
let slabUsed = 0;

function carve(bytes: number): { buf: ArrayBuffer; offset: number } {
  const size = (bytes + 7) & ~7;
  if (size > SLAB_BYTES / 4) return { buf: new ArrayBuffer(size), offset: 0 };
  if (slab === null || slabUsed + size > SLAB_BYTES) {
    slab = new ArrayBuffer(SLAB_BYTES);
    slabUsed = 0;
  }
  const offset = slabUsed;
  slabUsed += size;
  return { buf: slab, offset };
}

/** `count` zeroed Float64Array columns of length `n`, carved from a shared slab. */
export function float64Columns(n: number, count: number): Float64Array[] {
  const { buf, offset } = carve(n * count * 8);
  const out = new Array<Float64Array>(count);
  for (let k = 0; k < count; k++) out[k] = new Float64Array(buf, offset + k * n * 8, n);
  return out;
}

/** `count` zeroed Uint8Array columns of length `n`, carved from a shared slab. */
export function uint8Columns(n: number, count: number): Uint8Array[] {
  const { buf, offset } = carve(n * count);
  const out = new Array<Uint8Array>(count);
  for (let k = 0; k < count; k++) out[k] = new Uint8Array(buf, offset + k * n, n);
  return out;
}

const scratch: Float64Array[] = [];

/**
 * A reusable working array of at least `minLength` (contents undefined), one per `slot`. Only for
 * use inside one synchronous call that does not call back into another user of the same slot.
 */
export function scratchFloat64(slot: number, minLength: number): Float64Array {
  const cur = scratch[slot];
  if (cur && cur.length >= minLength) return cur;
  const next = new Float64Array(Math.max(minLength, 2 * (cur?.length ?? 0), 256));
  scratch[slot] = next;
  return next;
}

/** Scratch slot: tip instants while a record is parsed (storms.ts). */
export const SCRATCH_TIP_MS = 0;
/** Scratch slot: tip depths while a record is parsed (storms.ts). */
export const SCRATCH_TIP_DEPTH = 1;
/** Scratch slot: running depth for the window search (rain-energy.ts). */
export const SCRATCH_CUMULATIVE = 2;
/** Scratch slots: piece objects copied into columns (storms.ts piecesToScratchColumns). */
export const SCRATCH_PIECE_START = 3;
export const SCRATCH_PIECE_END = 4;
export const SCRATCH_PIECE_DEPTH = 5;
