import { describe, expect, it } from "vitest";
import {
  addDaysIso,
  runFieldAccount,
  WaterBalanceInputError,
  type AccountDay,
  type FieldAccountInput,
} from "@/lib/waterbalance";
import { plainField, rainTotal } from "./helpers";

const day = (days: AccountDay[], date: string): AccountDay => {
  const d = days.find((x) => x.date === date);
  if (!d) throw new Error(`no day ${date}`);
  return d;
};

describe("the daily balance, FAO-56 eq. 84-88, worked by hand", () => {
  it("a dry day adds ETc to depletion", () => {
    const r = runFieldAccount(plainField());
    const d0 = r.days[0]!;
    // FAO-56 eq. 85: Dr = 10 − 0 − 0 − 0 + 1.0 × 5 + 0 = 15
    expect(d0.depletionStartMm).toBe(10);
    expect(d0.etcMm).toBe(5);
    expect(d0.ks).toBe(1);
    expect(d0.etcAdjMm).toBe(5);
    expect(d0.depletionEndMm).toBe(15);
    expect(d0.tawMm).toBeCloseTo(150, 9); // FAO-56 eq. 82: 1000 × 0.15 × 1
    expect(d0.pAdjusted).toBeCloseTo(0.5, 12); // Table 22 footnote at ETc = 5
    expect(d0.rawMm).toBeCloseTo(75, 9); // FAO-56 eq. 83
    expect(d0.triggerMm).toBeCloseTo(75, 9);
    expect(r.days.map((d) => d.depletionEndMm)).toEqual([15, 20, 25, 30, 35, 40, 45, 50, 55, 60]);
    expect(r.allClose).toBe(true);
  });

  it("rain beyond field capacity drains as deep percolation (eq. 88)", () => {
    const r = runFieldAccount(plainField({ rain: [rainTotal("2026-11-02", 30)] }));
    const d1 = day(r.days, "2026-11-02");
    // start 15; 15 − 30 + 5 = −10 -> DP 10, Dr 0
    expect(d1.effectiveRainMm).toBe(30);
    expect(d1.deepPercolationMm).toBe(10);
    expect(d1.depletionEndMm).toBe(0);
    expect(d1.closure.closes).toBe(true);
    expect(d1.provenance.rain).toEqual({
      source: "own-gauge",
      gauges: [{ gaugeId: "g1", distanceKm: 0, weight: 1 }],
      missing: false,
      recorded: false,
    });
    expect(d1.provenance.runoff).toEqual({ method: "none" });
  });

  it("net irrigation is gross × application efficiency, or logged as net", () => {
    const r = runFieldAccount(
      plainField({
        irrigations: [
          { date: "2026-11-03", depthMm: 20, basis: "gross" },
          { date: "2026-11-05", depthMm: 12, basis: "net" },
        ],
      }),
    );
    const d2 = day(r.days, "2026-11-03");
    expect(d2.irrigationGrossMm).toBe(20);
    expect(d2.irrigationNetMm).toBeCloseTo(16, 12);
    expect(d2.depletionEndMm).toBeCloseTo(20 - 16 + 5, 12);
    expect(d2.provenance.irrigation).toBe("gross");
    const d4 = day(r.days, "2026-11-05");
    expect(d4.irrigationNetMm).toBe(12);
    expect(d4.irrigationGrossMm).toBeCloseTo(15, 12);
    expect(d4.provenance.irrigation).toBe("net");
  });

  it("Ks reduces ET once depletion passes RAW (eq. 84)", () => {
    const r = runFieldAccount(plainField({ initialDepletionMm: 100 }, 2));
    const d0 = r.days[0]!;
    // Ks = (150 − 100)/(150 − 75) = 0.6667; ETc adj = 0.6667 × 5 = 3.333
    expect(d0.ks).toBeCloseTo(2 / 3, 12);
    expect(d0.etcAdjMm).toBeCloseTo(10 / 3, 12);
    expect(d0.depletionEndMm).toBeCloseTo(100 + 10 / 3, 12);
  });

  it("p follows the day's ETc", () => {
    const r = runFieldAccount(plainField({}, 2, 8));
    expect(r.days[0]!.pAdjusted).toBeCloseTo(0.5 + 0.04 * (5 - 8), 12); // FAO-56 Table 22 footnote
    expect(r.days[0]!.rawMm).toBeCloseTo(0.38 * 150, 9);
  });

  it("depletion never passes TAW: ET stops at wilting point", () => {
    const r = runFieldAccount(plainField({ initialDepletionMm: 149 }, 5, 12));
    for (const d of r.days) {
      expect(d.depletionEndMm).toBeLessThanOrEqual(d.tawMm + 1e-12);
      expect(d.closure.closes).toBe(true);
    }
  });

  it("a soil check resets the start of its day to the measured depletion", () => {
    const r = runFieldAccount(plainField({ soilChecks: [{ date: "2026-11-04", depletionMm: 40 }] }));
    const d3 = day(r.days, "2026-11-04");
    expect(d3.soilCheckReset).toBe(true);
    expect(d3.carriedDepletionMm).toBe(25);
    expect(d3.depletionStartMm).toBe(40);
    expect(d3.depletionEndMm).toBe(45);
    expect(d3.closure.closes).toBe(true);
    expect(day(r.days, "2026-11-03").soilCheckReset).toBe(false);
  });

  it("capillary rise is zero unless given, and counts as inflow when given", () => {
    const r = runFieldAccount(plainField({ capillaryRise: [{ date: "2026-11-02", capillaryRiseMm: 2 }] }));
    expect(day(r.days, "2026-11-01").capillaryRiseMm).toBe(0);
    expect(day(r.days, "2026-11-02").capillaryRiseMm).toBe(2);
    expect(day(r.days, "2026-11-02").depletionEndMm).toBe(15 - 2 + 5);
  });

  it("roots grow from Zr min to Zr max and TAW with them", () => {
    const input = plainField({}, 40);
    input.planting = {
      ...input.planting,
      plantingDate: "2026-11-01",
      rootDepthMinM: 0.2,
      rootDepthMaxM: 1.0,
      stages: { iniDays: 10, devDays: 11, midDays: 50, lateDays: 10 },
    };
    const r = runFieldAccount(input);
    expect(r.days[0]!.rootDepthM).toBeCloseTo(0.2, 12);
    expect(r.days[0]!.tawMm).toBeCloseTo(30, 9);
    expect(day(r.days, "2026-11-21").rootDepthM).toBeCloseTo(1.0, 12); // day 21 = end of development
    expect(day(r.days, "2026-11-11").rootDepthM).toBeCloseTo(0.6, 12);
    expect(r.allClose).toBe(true);
  });
});

describe("runoff inside the account", () => {
  it("curve number on a daily total, antecedent condition from the account", () => {
    const input = plainField({ rain: [rainTotal("2026-11-02", 50)], initialDepletionMm: 40 });
    input.field = { ...input.field, runoff: { curveNumber: 80 } };
    const r = runFieldAccount(input);
    const d1 = day(r.days, "2026-11-02");
    // start Dr 45 of 150 = 0.30: average condition; S = 63.5, Ia = 12.7, Q = 37.3²/100.8 = 13.80 mm (NEH 630 ch. 10)
    expect(d1.runoffMm).toBeCloseTo((37.3 * 37.3) / 100.8, 9);
    expect(d1.effectiveRainMm).toBeCloseTo(50 - (37.3 * 37.3) / 100.8, 9);
    expect(d1.provenance.runoff).toMatchObject({
      method: "curve-number",
      condition: "average",
      curveNumber: 80,
      iaRatio: 0.2,
    });
    expect(d1.closure.closes).toBe(true);
  });

  it("a wet profile runs off more of the same storm", () => {
    const wet = plainField({ rain: [rainTotal("2026-11-01", 50)], initialDepletionMm: 0 });
    wet.field = { ...wet.field, runoff: { curveNumber: 80 } };
    const dry = { ...wet, initialDepletionMm: 100 };
    const rw = runFieldAccount(wet).days[0]!;
    const rd = runFieldAccount(dry).days[0]!;
    expect(rw.provenance.runoff).toMatchObject({ condition: "wet" });
    expect(rd.provenance.runoff).toMatchObject({ condition: "dry" });
    expect(rw.runoffMm).toBeGreaterThan(rd.runoffMm);
  });

  it("Green-Ampt on a time-stamped day, with energy, and a seal for the days after on bare soil", () => {
    const input = plainField({}, 6);
    input.field = { soil: { texture: "loam" }, areaHa: 10 };
    input.planting = { ...input.planting, plantingDate: "2026-10-25" }; // initial stage: bare
    const burst = (startIso: string, tips: number, gapS: number) =>
      Array.from({ length: tips }, (_, k) => ({
        at: Date.parse(startIso) + (k + 1) * gapS * 1000,
        depthMm: 0.2,
      }));
    input.rain = [
      {
        date: "2026-11-02",
        kind: "records",
        records: burst("2026-11-02T04:00:00Z", 150, 20),
        source: { kind: "own-gauge" },
      },
      {
        date: "2026-11-04",
        kind: "records",
        records: burst("2026-11-04T04:00:00Z", 100, 30),
        source: { kind: "own-gauge" },
      },
    ];
    const r = runFieldAccount(input);
    const d1 = day(r.days, "2026-11-02");
    expect(d1.rainMm).toBeCloseTo(30, 9);
    expect(d1.provenance.rain.recorded).toBe(true);
    const ro = d1.provenance.runoff;
    if (ro.method !== "green-ampt") throw new Error("expected Green-Ampt");
    expect(ro.storms).toHaveLength(1);
    expect(ro.sealFormed).toBe(true); // 30 mm at 36 mm/h on bare soil: E ≈ 8 MJ/ha, above the 2 MJ/ha default
    expect(ro.sealed).toBe(false);
    expect(ro.storms[0]!.energyMJha).toBeGreaterThan(2);
    expect(d1.runoffMm).toBeCloseTo(ro.storms[0]!.runoffMm, 12);
    const d3 = day(r.days, "2026-11-04");
    const ro3 = d3.provenance.runoff;
    if (ro3.method !== "green-ampt") throw new Error("expected Green-Ampt");
    expect(ro3.sealed).toBe(true);
    expect(ro3.storms[0]!.ksatFactor).toBe(0.5);
    expect(r.allClose).toBe(true);
  });
});

describe("provenance", () => {
  it("flags missing rain without filling it, and days with no rain record", () => {
    const r = runFieldAccount(plainField({ rain: [rainTotal("2026-11-02", null)] }));
    expect(day(r.days, "2026-11-02").provenance.rain.missing).toBe(true);
    expect(day(r.days, "2026-11-02").rainMm).toBe(0);
    expect(day(r.days, "2026-11-03").provenance.rain.source).toBe("no-record");
  });

  it("marks estimated ETo inputs and filled days", () => {
    const input = plainField({}, 4);
    input.station = { latitudeDeg: -27.5, elevationM: 150 };
    input.weather = [
      { date: "2026-11-01", tMaxC: 31, tMinC: 18, rhMaxPct: 90, rhMinPct: 40, windMs: 2.2, solarMJm2: 27 },
      { date: "2026-11-02", tMaxC: 30, tMinC: 17 },
      { date: "2026-11-03", tMaxC: 32, tMinC: 19, solarMJm2: 28 },
    ];
    const r = runFieldAccount(input);
    expect(r.days[0]!.provenance.eto).toEqual({ method: "penman-monteith", estimated: [] });
    expect(r.days[1]!.provenance.eto).toEqual({
      method: "hargreaves",
      estimated: ["solar", "humidity", "wind"],
    });
    expect(r.days[2]!.provenance.eto).toEqual({ method: "penman-monteith", estimated: ["humidity", "wind"] });
    expect(r.days[3]!.provenance.eto).toEqual({ method: "filled-mean", estimated: ["eto"] });
    expect(r.days[3]!.etoMm).toBeCloseTo((r.days[0]!.etoMm + r.days[1]!.etoMm + r.days[2]!.etoMm) / 3, 12);
  });
});

describe("climate-adjusted Kc and the dual coefficient", () => {
  it("adjusts Kc mid from the mid-season weather (eq. 62)", () => {
    const input = plainField({}, 3);
    input.planting = {
      ...input.planting,
      kc: { ini: 0.3, mid: 1.2, end: 0.35 },
      heightM: 2,
      climateAdjust: { midWindMs: 3, midRhMinPct: 30 },
    };
    const r = runFieldAccount(input);
    expect(r.kcUsed.mid).toBeCloseTo(1.2885, 4); // FAO-56 eq. 62 recomputed (see crop-coefficient checks)
    expect(r.kcUsed.end).toBe(0.35); // eq. 65 applies only from 0.45
    expect(r.days[0]!.kc).toBeCloseTo(1.2885, 4);
  });

  it("the dual coefficient adds soil evaporation after rain and still closes", () => {
    const input = plainField({ rain: [rainTotal("2026-11-03", 20)] }, 10);
    input.field = { soil: { texture: "sandy-loam" }, areaHa: 5, runoff: { dailyMethod: "none" } };
    input.planting = {
      ...input.planting,
      plantingDate: "2026-11-01",
      kc: { ini: 0.6, mid: 1.15, end: 0.8 },
      stages: { iniDays: 30, devDays: 40, midDays: 50, lateDays: 30 },
      rootDepthMinM: 0.3,
      rootDepthMaxM: 1,
      dual: { kcb: { ini: 0.15, mid: 1.1, end: 0.7 } },
    };
    const r = runFieldAccount(input);
    const wet = day(r.days, "2026-11-03");
    expect(wet.kcb).toBeCloseTo(0.15, 12);
    expect(wet.ke).toBeCloseTo(1.05, 9); // FAO-56 eq. 71: Kr 1, Kc max 1.2 − Kcb 0.15, few 1
    expect(wet.kc).toBeCloseTo(1.2, 9);
    expect(day(r.days, "2026-11-09").ke!).toBeLessThan(wet.ke!);
    expect(r.allClose).toBe(true);
  });
});

describe("bad input is a clear error", () => {
  it.each([
    ["end before start", { endDate: "2026-10-01" }, "endDate"],
    ["efficiency of zero", { system: { applicationEfficiency: 0 } }, "system.applicationEfficiency"],
    ["negative initial depletion", { initialDepletionMm: -1 }, "initialDepletionMm"],
    [
      "two rain entries on one day",
      { rain: [rainTotal("2026-11-02", 1), rainTotal("2026-11-02", 2)] },
      "rain",
    ],
    ["raw weather without a station", { weather: [{ date: "2026-11-01", tMaxC: 30, tMinC: 15 }] }, "station"],
    ["a malformed date", { startDate: "1/11/2026" }, "startDate"],
  ])("%s", (_name, overrides, field) => {
    try {
      runFieldAccount(plainField(overrides as Partial<FieldAccountInput>));
      throw new Error("no error");
    } catch (e) {
      expect(e).toBeInstanceOf(WaterBalanceInputError);
      expect((e as WaterBalanceInputError).field).toBe(field);
    }
  });

  it("spans the whole requested range", () => {
    const r = runFieldAccount(plainField({}, 30));
    expect(r.days).toHaveLength(30);
    expect(r.days[29]!.date).toBe(addDaysIso("2026-11-01", 29));
  });
});
