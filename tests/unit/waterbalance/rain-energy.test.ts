import { describe, expect, it } from "vitest";
import {
  maxDepthInWindowMm,
  stormEnergy,
  surfaceSealing,
  unitKineticEnergyMJhaMm,
  type HyetographPiece,
} from "@/lib/waterbalance";

const H = 3_600_000;
const piece = (startH: number, endH: number, depthMm: number): HyetographPiece => ({
  startMs: startH * H,
  endMs: endH * H,
  depthMm,
});

describe("unit kinetic energy", () => {
  it("at 25 mm/h matches each named formula", () => {
    expect(unitKineticEnergyMJhaMm(25, "wischmeier-smith-1978")).toBeCloseTo(0.241, 4); // Wischmeier and Smith 1978: 0.119 + 0.0873 log10 25
    expect(unitKineticEnergyMJhaMm(25, "brown-foster-1987")).toBeCloseTo(0.2302, 4); // Brown and Foster 1987: 0.29 [1 − 0.72 e^(−1.25)]
    expect(unitKineticEnergyMJhaMm(25, "mcgregor-1995")).toBeCloseTo(0.2631, 4); // McGregor et al. 1995: 0.29 [1 − 0.72 e^(−2.05)]
    expect(unitKineticEnergyMJhaMm(25)).toBe(unitKineticEnergyMJhaMm(25, "mcgregor-1995"));
  });

  it("caps Wischmeier and Smith at 0.283 above 76 mm/h and approaches 0.29 for the exponential forms", () => {
    expect(unitKineticEnergyMJhaMm(100, "wischmeier-smith-1978")).toBe(0.283); // Wischmeier and Smith 1978
    expect(unitKineticEnergyMJhaMm(500, "mcgregor-1995")).toBeCloseTo(0.29, 6); // McGregor et al. 1995 asymptote
    expect(unitKineticEnergyMJhaMm(0, "mcgregor-1995")).toBeCloseTo(0.29 * 0.28, 12);
  });
});

describe("storm energy, I30 and EI30", () => {
  it("sums e(i) × depth over the pieces and takes I30 from the wettest half hour", () => {
    // 30 min at 50 mm/h then 60 min at 10 mm/h; by hand with McGregor et al. 1995:
    // e(50) = 0.286539, e(10) = 0.198038 -> E = 25 × 0.286539 + 10 × 0.198038 = 9.14386 MJ/ha
    const s = stormEnergy([piece(0, 0.5, 25), piece(0.5, 1.5, 10)]);
    expect(s.energyMJha).toBeCloseTo(9.14386, 4);
    expect(s.i30MmH).toBeCloseTo(50, 9); // Wischmeier and Smith 1978 definition of I30
    expect(s.ei30).toBeCloseTo(9.14386 * 50, 2);
    expect(s.depthMm).toBe(35);
    expect(s.durationH).toBeCloseTo(1.5, 12);
    expect(s.erosive).toBe(true); // Renard et al. 1997: at least 12.7 mm
  });

  it("finds a 30-minute window that spans two pieces", () => {
    // 20 min at 60 mm/h (20 mm) then 20 min at 30 mm/h (10 mm): best window 20 + 5 = 25 mm
    const pieces = [piece(0, 1 / 3, 20), piece(1 / 3, 2 / 3, 10)];
    expect(maxDepthInWindowMm(pieces, 30)).toBeCloseTo(25, 9);
    expect(stormEnergy(pieces).i30MmH).toBeCloseTo(50, 9);
  });

  it("doubles the depth of a storm shorter than 30 minutes", () => {
    expect(stormEnergy([piece(0, 1 / 3, 10)]).i30MmH).toBeCloseTo(20, 9); // RUSLE convention (Renard et al. 1997)
  });

  it("a small, gentle storm is not erosive", () => {
    expect(stormEnergy([piece(0, 2, 4)]).erosive).toBe(false);
  });
});

describe("surface sealing", () => {
  it("flags bare soil after a high-energy storm, never a covered field", () => {
    const big = stormEnergy([piece(0, 0.5, 25), piece(0.5, 1.5, 10)]);
    expect(surfaceSealing(big, true)).toEqual({ ksatFactor: 0.5, days: 7 }); // defaults: common practice, no source
    expect(surfaceSealing(big, false)).toBeNull();
    expect(surfaceSealing({ energyMJha: 1 }, true)).toBeNull();
    expect(surfaceSealing(big, true, { ksatFactor: 0.3, days: 3, energyThresholdMJha: 5 })).toEqual({
      ksatFactor: 0.3,
      days: 3,
    });
  });
});
