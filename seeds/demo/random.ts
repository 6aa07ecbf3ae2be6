/**
 * Deterministic randomness for the demo scenario: every number is drawn from a stream keyed by a string
 * (a date, a gauge, a purpose), so a day's weather depends only on that day, never on when the seed ran
 * or on what was generated before it.
 */
import { createHash } from "node:crypto";

/** A 32-bit hash of a key (FNV-1a), the seed of that key's stream. */
function hash32(key: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < key.length; i++) {
    h ^= key.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** A small, fast generator (mulberry32): fine for scenery, not for secrets. */
export class Stream {
  private state: number;

  constructor(key: string) {
    this.state = hash32(key);
  }

  /** Uniform in [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** Uniform in [lo, hi). */
  between(lo: number, hi: number): number {
    return lo + (hi - lo) * this.next();
  }

  /** Standard normal (Box-Muller). */
  normal(): number {
    const u = Math.max(this.next(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * this.next());
  }

  /** Exponential with the given mean. */
  exponential(mean: number): number {
    return -mean * Math.log(1 - this.next());
  }
}

/** A stream for one purpose on one key: `stream("2026-10-03", "storm")`. */
export function stream(...key: string[]): Stream {
  return new Stream(key.join("|"));
}

/**
 * A stable uuid for a named demo object (name-based, version 5 layout), so ids are the same on every run
 * and tests or links can name a demo field without looking it up.
 */
export function demoId(name: string): string {
  const h = createHash("sha1").update(`rootbank-demo:${name}`).digest();
  h[6] = (h[6]! & 0x0f) | 0x50;
  h[8] = (h[8]! & 0x3f) | 0x80;
  const hex = h.subarray(0, 16).toString("hex");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** Rounds to a number of decimals (the precision an instrument or a person would write down). */
export function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
