import { describe, expect, it } from "vitest";
import { mean, rootMeanSquare } from "simple-statistics";
import { errorStats, minimiseOnInterval, pairChecks, suggestKcScale } from "@/lib/calibration";
import { addDaysIso, runFieldAccount, type FieldAccountInput } from "@/lib/waterbalance";
import { plainField, seededRandom } from "./waterbalance/helpers";

describe("errorStats", () => {
  it("works out bias, RMSE and MAE by hand", () => {
    // errors 2, −5, 0: mean −1, MAE 7/3, RMSE √(29/3) (hand-worked, from memory of the definitions)
    const s = errorStats([
      { modelledMm: 10, observedMm: 8 },
      { modelledMm: 20, observedMm: 25 },
      { modelledMm: 30, observedMm: 30 },
    ]);
    expect(s.n).toBe(3);
    expect(s.meanErrorMm).toBeCloseTo(-1, 12);
    expect(s.maeMm).toBeCloseTo(7 / 3, 12);
    expect(s.rmseMm).toBeCloseTo(Math.sqrt(29 / 3), 12);
  });

  it("agrees with simple-statistics on generated pairs", () => {
    const rnd = seededRandom(7);
    const pairs = Array.from({ length: 40 }, () => ({ modelledMm: rnd() * 120, observedMm: rnd() * 120 }));
    const errors = pairs.map((p) => p.modelledMm - p.observedMm);
    const s = errorStats(pairs);
    // reference values: simple-statistics mean and rootMeanSquare of the same errors
    expect(s.meanErrorMm).toBeCloseTo(mean(errors), 10);
    expect(s.rmseMm).toBeCloseTo(rootMeanSquare(errors), 10);
    expect(s.maeMm).toBeCloseTo(mean(errors.map(Math.abs)), 10);
  });

  it("has no statistics without pairs", () => {
    expect(errorStats([])).toEqual({ n: 0, meanErrorMm: null, rmseMm: null, maeMm: null });
  });
});

describe("minimiseOnInterval", () => {
  it("finds the vertex of a parabola", () => {
    // (x − 1.37)² has its minimum at 1.37 (hand-worked)
    const found = minimiseOnInterval((x) => (x - 1.37) ** 2, 0.5, 2, { tolerance: 1e-6 });
    expect(found.x).toBeCloseTo(1.37, 5);
  });

  it("finds the lower of two valleys when the scan sees it", () => {
    // valleys at 0.7 (depth 0) and 1.8 (depth 0.5): the global one is 0.7 (hand-worked)
    const f = (x: number) => Math.min((x - 0.7) ** 2 * 10, (x - 1.8) ** 2 * 10 + 0.5);
    expect(minimiseOnInterval(f, 0.5, 2).x).toBeCloseTo(0.7, 3);
  });

  it("refuses an empty interval", () => {
    expect(() => minimiseOnInterval((x) => x, 1, 1)).toThrow(RangeError);
  });
});

describe("suggestKcScale on checks generated from the engine", () => {
  const days = 60;
  function season(scale: number, checks: { date: string; depletionMm: number }[] = []): FieldAccountInput {
    const base = plainField({}, days, 5);
    const irrigations = [14, 29, 44].map((d) => ({
      date: addDaysIso(base.startDate, d),
      depthMm: 50,
      basis: "net" as const,
    }));
    return {
      ...base,
      planting: { ...base.planting, kc: { ini: 0.9 * scale, mid: 0.9 * scale, end: 0.9 * scale } },
      irrigations,
      soilChecks: checks,
    };
  }
  const checkDays = [6, 12, 20, 27, 35, 41, 50, 57];

  function carriedAt(input: FieldAccountInput, dates: readonly string[]): number[] {
    const byDate = new Map(runFieldAccount(input).days.map((d) => [d.date, d.carriedDepletionMm]));
    return dates.map((d) => byDate.get(d)!);
  }

  it("suggests ≈ 1.2 when the field used Kc × 1.2", () => {
    const start = plainField({}, days).startDate;
    const dates = checkDays.map((d) => addDaysIso(start, d));
    // the "field": the engine itself with Kc × 1.2 (synthetic case, common practice, no source)
    const observed = carriedAt(season(1.2), dates);
    const checks = dates.map((date, k) => ({ date, depletionMm: observed[k]! }));
    const s = suggestKcScale(observed, (k) => carriedAt(season(k, checks), dates));
    expect(s.scale).toBeCloseTo(1.2, 2);
    expect(s.withScale?.rmseMm).toBeLessThan(0.5);
    // the unscaled curve under-predicts depletion: negative bias
    const pairs = pairChecks(
      checks,
      new Map(runFieldAccount(season(1, checks)).days.map((d) => [d.date, d.carriedDepletionMm])),
    );
    expect(errorStats(pairs).meanErrorMm).toBeLessThan(0);
  });

  it("suggests nothing from two checks", () => {
    expect(suggestKcScale([10, 20], () => [10, 20]).scale).toBeNull();
  });
});
