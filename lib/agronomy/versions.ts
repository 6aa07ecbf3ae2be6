/**
 * Versions of a planting, crop or soil read back from its audit history, and the comparison of two.
 * Pure: the screen and the tests use it alike.
 */

/** What the audit history hands over for one change. */
export interface HistoryChange {
  id: string;
  at: string;
  action: string;
  userName: string | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/** A version: the values as they stood after a change (or before the oldest one recorded). */
export interface Version {
  /** the change that made it, or `initial:<id>` for the state before the oldest change kept */
  key: string;
  at: string;
  label: string;
  reason: string | null;
  values: Record<string, unknown>;
}

/** Keys that are bookkeeping, not settings. */
const IGNORED = new Set(["id", "createdAt", "updatedAt", "farmId", "fieldId", "library"]);

/** Versions oldest first: the state before the oldest change (when known), then the state after each change. */
export function versionsOf(history: readonly HistoryChange[]): Version[] {
  const oldestFirst = [...history].sort((a, b) =>
    a.at < b.at ? -1 : a.at > b.at ? 1 : Number(a.id) - Number(b.id),
  );
  const out: Version[] = [];
  const first = oldestFirst[0];
  if (first?.before && first.action !== "create") {
    out.push({
      key: `initial:${first.id}`,
      at: first.at,
      label: "Before the first recorded change",
      reason: null,
      values: first.before,
    });
  }
  for (const h of oldestFirst) {
    if (!h.after) continue;
    out.push({
      key: h.id,
      at: h.at,
      label: `${h.action} by ${h.userName ?? "the system"}`,
      reason: h.reason,
      values: h.after,
    });
  }
  return out;
}

/** One row of a comparison. */
export interface ComparedValue {
  key: string;
  left: unknown;
  right: unknown;
  changed: boolean;
}

function same(a: unknown, b: unknown): boolean {
  if (typeof a === "number" && typeof b === "number") return Math.abs(a - b) < 1e-9;
  return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}

/** The settings of two versions side by side, changed ones marked; keys in `order` first, then the rest by name. */
export function compareVersions(
  left: Record<string, unknown>,
  right: Record<string, unknown>,
  order: readonly string[] = [],
): ComparedValue[] {
  const keys = new Set([...Object.keys(left), ...Object.keys(right)].filter((k) => !IGNORED.has(k)));
  const ordered = [
    ...order.filter((k) => keys.has(k)),
    ...[...keys].filter((k) => !order.includes(k)).sort(),
  ];
  return ordered.map((key) => ({
    key,
    left: left[key] ?? null,
    right: right[key] ?? null,
    changed: !same(left[key], right[key]),
  }));
}

/** The settings one change altered (before → after). */
export function changedKeys(change: Pick<HistoryChange, "before" | "after">): string[] {
  if (!change.before || !change.after) return [];
  return compareVersions(change.before, change.after)
    .filter((c) => c.changed)
    .map((c) => c.key);
}
