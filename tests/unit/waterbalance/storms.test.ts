import { describe, expect, it } from "vitest";
import {
  accountDayOfInstant,
  accountDayOfManualReading,
  accountDayOfReadingDate,
  buildHyetograph,
  dailyTotalsFromRecords,
  groupRecordsByAccountDay,
  separateStorms,
  stormsFromRecords,
  type RainRecord,
} from "@/lib/waterbalance";

const T0 = Date.UTC(2026, 10, 29, 20, 0, 0);
const MIN = 60_000;
const tip = (ms: number): RainRecord => ({ at: ms, depthMm: 0.2 });

describe("tips to a hyetograph", () => {
  it("takes intensity from the time between tips, not from clock windows", () => {
    const { pieces } = buildHyetograph([tip(T0), tip(T0 + MIN), tip(T0 + 3 * MIN)]);
    const rate = (k: number) => pieces[k]!.depthMm / ((pieces[k]!.endMs - pieces[k]!.startMs) / 3_600_000);
    expect(pieces).toHaveLength(3);
    // common practice, no source: 0.2 mm in 1 min = 12 mm/h; the first tip borrows the next interval
    expect(rate(0)).toBeCloseTo(12, 9);
    expect(rate(1)).toBeCloseTo(12, 9);
    expect(rate(2)).toBeCloseTo(6, 9);
  });

  it("spreads a tip after a long quiet spell over at most an hour", () => {
    const { pieces } = buildHyetograph([tip(T0), tip(T0 + 180 * MIN)]);
    expect(pieces[1]!.endMs - pieces[1]!.startMs).toBe(60 * MIN);
    const { pieces: p2 } = buildHyetograph([tip(T0), tip(T0 + 180 * MIN)], { maxTipIntervalMin: 20 });
    expect(p2[1]!.endMs - p2[1]!.startMs).toBe(20 * MIN);
  });

  it("drops switch bounce", () => {
    const { pieces, droppedTips } = buildHyetograph([tip(T0), tip(T0 + 200), tip(T0 + 2 * MIN)]);
    expect(droppedTips).toBe(1);
    expect(pieces).toHaveLength(2);
  });

  it("spreads logger intervals evenly and reads ISO instants", () => {
    const { pieces } = buildHyetograph([
      { at: "2026-11-29T20:15:00Z", depthMm: 3, intervalMin: 15 },
      { at: "2026-11-29T20:30:00.000Z", depthMm: 1, intervalMin: 15 },
    ]);
    expect(pieces).toEqual([
      { startMs: T0, endMs: T0 + 15 * MIN, depthMm: 3 },
      { startMs: T0 + 15 * MIN, endMs: T0 + 30 * MIN, depthMm: 1 },
    ]);
  });

  it("rejects unreadable instants and negative depths", () => {
    expect(() => buildHyetograph([{ at: "yesterday", depthMm: 0.2 }])).toThrow(/at/);
    expect(() => buildHyetograph([{ at: T0, depthMm: -0.2 }])).toThrow(/depthMm/);
  });
});

describe("storm separation", () => {
  const records = [
    tip(T0),
    tip(T0 + 5 * MIN),
    tip(T0 + 5 * 60 * MIN),
    tip(T0 + 12 * 60 * MIN),
    tip(T0 + 12 * 60 * MIN + 2 * MIN),
  ];
  it("splits at a dry gap of 6 h by default", () => {
    const { storms } = stormsFromRecords(records);
    expect(storms.map((s) => s.pieces.length)).toEqual([3, 2]);
    expect(storms[0]!.depthMm).toBeCloseTo(0.6, 12);
  });

  it("takes a configurable gap", () => {
    const { storms } = stormsFromRecords(records, { dryGapH: 2 });
    expect(storms.map((s) => s.pieces.length)).toEqual([2, 1, 2]);
    expect(separateStorms([])).toEqual([]);
  });
});

describe("the reading-day rule", () => {
  it("books rain up to the 09:00 boundary to the day before", () => {
    // Brisbane is UTC+10 all year: 09:00 local on the 30th is 23:00 UTC on the 29th
    const nine = Date.UTC(2026, 10, 29, 23, 0, 0);
    expect(accountDayOfInstant(nine, "Australia/Brisbane", 9)).toBe("2026-11-29");
    expect(accountDayOfInstant(nine + 1000, "Australia/Brisbane", 9)).toBe("2026-11-30");
    expect(accountDayOfInstant(nine - 10 * 3_600_000, "Australia/Brisbane", 9)).toBe("2026-11-29");
    expect(accountDayOfInstant(nine - 24 * 3_600_000 + 1000, "Australia/Brisbane", 9)).toBe("2026-11-29");
  });

  it("keeps the boundary on local clock time across a daylight-saving change", () => {
    // Sydney moves to UTC+11 on Sunday 4 October 2026; 09:00 local that day is 22:00 UTC on the 3rd
    const nine = Date.UTC(2026, 9, 3, 22, 0, 0);
    expect(accountDayOfInstant(nine, "Australia/Sydney", 9)).toBe("2026-10-03");
    expect(accountDayOfInstant(nine + 1000, "Australia/Sydney", 9)).toBe("2026-10-04");
  });

  it("books a manual reading near the boundary hour to the day before", () => {
    expect(accountDayOfManualReading("2026-11-29T23:30:00Z", "Australia/Brisbane", 9)).toBe("2026-11-29"); // 09:30 local on the 30th
    expect(accountDayOfManualReading("2026-11-29T22:40:00Z", "Australia/Brisbane", 9)).toBe("2026-11-29"); // 08:40
    expect(accountDayOfReadingDate("2026-12-01")).toBe("2026-11-30");
  });

  it("groups records into account days with the same boundary", () => {
    const nine = Date.UTC(2026, 10, 29, 23, 0, 0);
    const recs = [
      tip(nine - 60_000),
      tip(nine),
      tip(nine + 60_000),
      { at: nine + 2 * 3_600_000, depthMm: 1.5, intervalMin: 60 },
    ];
    const groups = groupRecordsByAccountDay(recs, "Australia/Brisbane", 9);
    expect(groups.map((g) => [g.date, Math.round(g.rainMm * 10) / 10, g.records.length])).toEqual([
      ["2026-11-29", 0.4, 2],
      ["2026-11-30", 1.7, 2],
    ]);
    expect(dailyTotalsFromRecords(recs, "Australia/Brisbane", 9).get("2026-11-29")).toBeCloseTo(0.4, 12);
    expect(() => groupRecordsByAccountDay(recs, "Mars/Olympus_Mons", 9)).toThrow(/time zone/);
  });
});
