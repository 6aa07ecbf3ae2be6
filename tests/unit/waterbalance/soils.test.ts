import { describe, expect, it } from "vitest";
import {
  findTexture,
  readilyAvailableWaterMm,
  resolveSoil,
  SOIL_TEXTURES,
  totalAvailableWaterMm,
  WaterBalanceInputError,
} from "@/lib/waterbalance";

describe("TAW and RAW, FAO-56 eq. 82-83", () => {
  it("computes TAW from θFC, θWP and root depth", () => {
    // FAO-56 eq. 82 by hand: 1000 × (0.23 − 0.10) × 0.8 = 104 mm
    expect(totalAvailableWaterMm(0.23, 0.1, 0.8)).toBeCloseTo(104, 9);
    expect(readilyAvailableWaterMm(104, 0.5)).toBeCloseTo(52, 9); // FAO-56 eq. 83
  });
});

describe("texture library", () => {
  it.each([
    // FAO-56 Table 19 ranges: θFC, θWP, REW, TEW
    ["sand", [0.07, 0.17], [0.02, 0.07], [2, 7], [6, 12]],
    ["loamy-sand", [0.11, 0.19], [0.03, 0.1], [4, 8], [9, 14]],
    ["sandy-loam", [0.18, 0.28], [0.06, 0.16], [6, 10], [15, 20]],
    ["loam", [0.2, 0.3], [0.07, 0.17], [8, 10], [16, 22]],
    ["silt-loam", [0.22, 0.36], [0.09, 0.21], [8, 11], [18, 25]],
    ["silty-clay-loam", [0.3, 0.37], [0.17, 0.24], [8, 11], [22, 27]],
    ["clay", [0.32, 0.4], [0.2, 0.24], [8, 12], [22, 29]],
  ] as const)("%s carries FAO-56 Table 19's ranges and a default inside them", (id, fc, wp, rew, tew) => {
    const t = findTexture(id);
    expect(t).toBeDefined();
    if (!t) return;
    expect(t.thetaFcRange).toEqual(fc);
    expect(t.thetaWpRange).toEqual(wp);
    expect(t.thetaFc).toBeCloseTo((fc[0] + fc[1]) / 2, 3);
    expect(t.thetaWp).toBeCloseTo((wp[0] + wp[1]) / 2, 3);
    expect(t.rewMm).toBeGreaterThanOrEqual(rew[0]);
    expect(t.rewMm).toBeLessThanOrEqual(rew[1]);
    expect(t.tewMm).toBeGreaterThanOrEqual(tew[0]);
    expect(t.tewMm).toBeLessThanOrEqual(tew[1]);
    expect(t.waterSource).toBe("FAO-56 Table 19");
  });

  it.each([
    // Rawls, Brakensiek and Miller 1983 via Chow, Maidment and Mays 1988 Table 4.3.1:
    // porosity, effective porosity, suction (cm), K (cm/h); suction confirmed, the rest from memory
    ["sand", 0.437, 0.417, 4.95, 11.78],
    ["loamy-sand", 0.437, 0.401, 6.13, 2.99],
    ["sandy-loam", 0.453, 0.412, 11.01, 1.09],
    ["loam", 0.463, 0.434, 8.89, 0.34],
    ["silt-loam", 0.501, 0.486, 16.68, 0.65],
    ["sandy-clay-loam", 0.398, 0.33, 21.85, 0.15],
    ["clay-loam", 0.464, 0.309, 20.88, 0.1],
    ["silty-clay-loam", 0.471, 0.432, 27.3, 0.1],
    ["sandy-clay", 0.43, 0.321, 23.9, 0.06],
    ["silty-clay", 0.479, 0.423, 29.22, 0.05],
    ["clay", 0.475, 0.385, 31.63, 0.03],
  ] as const)("%s has the Green-Ampt parameters of Rawls et al. 1983", (id, eta, thetaE, psiCm, kCmH) => {
    const ga = findTexture(id)?.greenAmpt;
    expect(ga).toBeDefined();
    if (!ga) return;
    expect(ga.porosity).toBe(eta);
    expect(ga.effectivePorosity).toBe(thetaE);
    expect(ga.suctionMm).toBeCloseTo(psiCm * 10, 9);
    expect(ga.ksatMmH).toBeCloseTo(kCmH * 10, 9);
  });

  it("keeps θWP < θFC < porosity for every texture", () => {
    for (const t of SOIL_TEXTURES) {
      expect(t.thetaWp).toBeLessThan(t.thetaFc);
      expect(t.thetaFc).toBeLessThan(t.greenAmpt.porosity);
      expect(t.rewMm).toBeLessThan(t.tewMm);
    }
  });

  it("lets explicit values override the texture and rejects impossible soils", () => {
    const s = resolveSoil({ texture: "loam", thetaFc: 0.31 });
    expect(s.thetaFc).toBe(0.31);
    expect(s.thetaWp).toBe(0.12);
    expect(s.greenAmpt?.suctionMm).toBeCloseTo(88.9, 9);
    expect(() => resolveSoil({ thetaFc: 0.2, thetaWp: 0.25 })).toThrow(WaterBalanceInputError);
    expect(() => resolveSoil({})).toThrow(/texture/);
  });
});
