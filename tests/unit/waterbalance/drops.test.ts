import { describe, expect, it } from "vitest";
import {
  atlasFallSpeedMs,
  marshallPalmerDensity,
  marshallPalmerLambdaPerMm,
  marshallPalmerSummary,
  MAX_RAINDROP_DIAMETER_MM,
  stokesFallSpeedMs,
  terminalFallSpeedMs,
  unitKineticEnergyMJhaMm,
} from "@/lib/waterbalance";

describe("terminal fall speed against Gunn and Kinzer (1949)", () => {
  it.each([
    // Gunn and Kinzer 1949 measured speeds, m/s; Atlas et al. 1973 fit is good to about 0.15 m/s
    [1.0, 4.03],
    [3.0, 8.06],
    [4.0, 8.83],
    [5.0, 9.09],
  ])("D = %s mm falls at %s m/s (Atlas et al. 1973 fit)", (d, v) => {
    expect(Math.abs(terminalFallSpeedMs(d) - v)).toBeLessThanOrEqual(0.15);
  });

  it("the largest measured drop, 5.8 mm, within 0.2 m/s of 9.17", () => {
    expect(Math.abs(terminalFallSpeedMs(5.8) - 9.17)).toBeLessThanOrEqual(0.2); // Gunn and Kinzer 1949
  });

  it("a 0.5 mm drop, below the fit's range, within 0.1 m/s of 2.06", () => {
    expect(Math.abs(terminalFallSpeedMs(0.5) - 2.06)).toBeLessThanOrEqual(0.1); // Gunn and Kinzer 1949
  });

  it("the Atlas fit itself", () => {
    expect(atlasFallSpeedMs(2)).toBeCloseTo(9.65 - 10.3 * Math.exp(-1.2), 12); // Atlas, Srivastava and Sekhon 1973
  });

  it("rises with diameter across the regime boundaries", () => {
    let prev = 0;
    for (let d = 0.005; d <= 8; d += 0.005) {
      const v = terminalFallSpeedMs(d);
      expect(v).toBeGreaterThan(prev);
      prev = v;
    }
  });
});

describe("facts of the trade", () => {
  it("a cloud droplet of 0.01 mm radius falls at about 0.012 m/s (Stokes)", () => {
    expect(stokesFallSpeedMs(1e-5)).toBeCloseTo(0.012, 3); // common practice, no source
    expect(terminalFallSpeedMs(0.02)).toBeCloseTo(0.012, 3);
  });

  it("raindrops beyond about 1 cm break up, so distributions are truncated there", () => {
    expect(MAX_RAINDROP_DIAMETER_MM).toBe(10); // common practice, no source
    expect(() => terminalFallSpeedMs(12)).toThrow(/diameterMm/);
    expect(marshallPalmerDensity(10.5, 25)).toBe(0);
    expect(marshallPalmerDensity(2, 25)).toBeGreaterThan(0);
  });
});

describe("Marshall-Palmer distribution", () => {
  it("N(D) = 8000 exp(−4.1 R^−0.21 D)", () => {
    const lam = marshallPalmerLambdaPerMm(25);
    expect(lam).toBeCloseTo(4.1 * Math.pow(25, -0.21), 12); // Marshall and Palmer 1948
    expect(marshallPalmerDensity(0, 25)).toBe(8000); // Marshall and Palmer 1948
    expect(marshallPalmerDensity(1, 25)).toBeCloseTo(8000 * Math.exp(-lam), 9);
  });

  it("has median volume diameter 3.67/Λ (exponential distribution, from memory)", () => {
    for (const r of [1, 10, 50]) {
      expect(marshallPalmerSummary(r).medianVolumeDiameterMm).toBeCloseTo(
        3.67 / marshallPalmerLambdaPerMm(r),
        2,
      );
    }
  });

  it("holds N0/Λ drops per m³ and its kinetic energy per mm falls among the empirical formulas", () => {
    const s = marshallPalmerSummary(25);
    expect(s.numberPerM3).toBeCloseTo(8000 / marshallPalmerLambdaPerMm(25), 0);
    // common practice, no source: a DSD-derived unit energy should sit near the fitted relations
    const lo = Math.min(
      unitKineticEnergyMJhaMm(25, "brown-foster-1987"),
      unitKineticEnergyMJhaMm(25, "wischmeier-smith-1978"),
    );
    expect(s.unitEnergyMJhaMm).toBeGreaterThan(lo - 0.03);
    expect(s.unitEnergyMJhaMm).toBeLessThan(0.29);
  });
});
