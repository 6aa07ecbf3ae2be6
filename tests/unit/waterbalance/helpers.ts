import type { FieldAccountInput, RainDayInput, WeatherDayInput } from "@/lib/waterbalance";
import { addDaysIso } from "@/lib/waterbalance";

/**
 * A plain test field: θFC 0.30, θWP 0.15 (150 mm/m), roots fixed at 1 m (TAW 150 mm), Kc 1.0 all
 * season, p 0.5 (RAW 75 mm at ETc 5 mm/d), efficiency 0.8, no runoff unless asked.
 */
export function plainField(
  overrides: Partial<FieldAccountInput> = {},
  days = 10,
  etoMm = 5,
): FieldAccountInput {
  const startDate = "2026-11-01";
  const weather: WeatherDayInput[] = [];
  for (let d = 0; d < days; d++) weather.push({ date: addDaysIso(startDate, d), etoMm });
  return {
    field: { soil: { thetaFc: 0.3, thetaWp: 0.15 }, areaHa: 10, runoff: { dailyMethod: "none" } },
    planting: {
      plantingDate: "2026-10-01",
      kc: { ini: 1, mid: 1, end: 1 },
      stages: { iniDays: 10, devDays: 10, midDays: 200, lateDays: 10 },
      rootDepthMinM: 1,
      rootDepthMaxM: 1,
      pTable: 0.5,
    },
    system: { applicationEfficiency: 0.8 },
    weather,
    rain: [],
    startDate,
    endDate: addDaysIso(startDate, days - 1),
    initialDepletionMm: 10,
    ...overrides,
  };
}

/** A daily rain total for a date. */
export function rainTotal(date: string, rainMm: number | null): RainDayInput {
  return {
    date,
    kind: "total",
    rainMm,
    source: { kind: "own-gauge", gauges: [{ gaugeId: "g1", distanceKm: 0, weight: 1 }] },
  };
}

/** Mulberry32: a small seeded PRNG so generated seasons repeat. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
