import { describe, expect, it } from "vitest";
import { cropValueSources, soilValueSources } from "@/lib/agronomy/sources";
import { changedKeys, compareVersions, versionsOf, type HistoryChange } from "@/lib/agronomy/versions";

const change = (
  id: string,
  at: string,
  before: Record<string, unknown> | null,
  after: Record<string, unknown> | null,
  action = "update",
): HistoryChange => ({
  id,
  at,
  action,
  userName: "Ada",
  reason: `reason ${id}`,
  before,
  after,
});

describe("versions from the audit history", () => {
  // Invented history: Kc mid 1.2 → 1.3 → 1.35 (hand-made values, common practice, no source)
  const history = [
    change(
      "3",
      "2026-12-02T01:00:00Z",
      { kcMid: 1.3, p: 0.5, updatedAt: "b" },
      { kcMid: 1.35, p: 0.5, updatedAt: "c" },
    ),
    change(
      "2",
      "2026-12-01T01:00:00Z",
      { kcMid: 1.2, p: 0.5, updatedAt: "a" },
      { kcMid: 1.3, p: 0.5, updatedAt: "b" },
    ),
  ];

  it("lists the state before the oldest change, then each change's result, oldest first", () => {
    const v = versionsOf(history);
    expect(v.map((x) => x.values.kcMid)).toEqual([1.2, 1.3, 1.35]);
    expect(v[1]!.reason).toBe("reason 2");
  });

  it("starts from the created values when the history goes back to the creation", () => {
    const v = versionsOf([change("1", "2026-11-01T00:00:00Z", null, { kcMid: 1.2 }, "create"), ...history]);
    expect(v.map((x) => x.values.kcMid)).toEqual([1.2, 1.3, 1.35]);
  });

  it("marks exactly the changed settings, ignoring bookkeeping", () => {
    const rows = compareVersions(
      { kcMid: 1.2, p: 0.5, updatedAt: "a" },
      { kcMid: 1.35, p: 0.5, updatedAt: "c" },
      ["p", "kcMid"],
    );
    expect(rows).toEqual([
      { key: "p", left: 0.5, right: 0.5, changed: false },
      { key: "kcMid", left: 1.2, right: 1.35, changed: true },
    ]);
    expect(changedKeys(history[0]!)).toEqual(["kcMid"]);
    expect(compareVersions({ mad: null }, { mad: 0.4 })[0]!.changed).toBe(true);
  });
});

describe("published sources of library values", () => {
  it("names FAO-56 Table 12 for a library crop's Kc and Table 22 for its p", () => {
    // lib/waterbalance/crops.ts: maize (grain) Kc from Table 12, roots and p from Table 22 (Allen et al. 1998)
    const s = cropValueSources("Maize (grain)");
    expect(s?.kcMid).toBe("FAO-56 Table 12");
    expect(s?.p).toBe("FAO-56 Table 22");
    expect(s?.stageMidDays).toMatch(/^FAO-56 Table 11/);
    expect(cropValueSources("Not a library crop")).toBeNull();
  });

  it("names FAO-56 Table 19 for a texture's water contents", () => {
    // lib/waterbalance/soils.ts: loam water contents from FAO-56 Table 19
    expect(soilValueSources("loam")?.thetaFc).toMatch(/FAO-56 Table 19/);
    expect(soilValueSources("moon-dust")).toBeNull();
  });
});
