import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  addDaysIso,
  findCrop,
  runFieldAccount,
  type AccountDay,
  type FieldAccountInput,
  type RainDayInput,
  type WeatherDayInput,
} from "@/lib/waterbalance";
import { seededRandom } from "./helpers";

/**
 * Whole-season golden fixtures: a reviewed record of what the engine says for two fixed seasons.
 * Regenerate with UPDATE_GOLDEN=1 npx vitest run --project unit tests/unit/waterbalance/golden.test.ts
 * and review the diff like code.
 */

const DIR = path.join(__dirname, "golden");
const UPDATE = process.env.UPDATE_GOLDEN === "1";

function season(seed: number, cropId: string, dual: boolean): FieldAccountInput {
  const rnd = seededRandom(seed);
  const crop = findCrop(cropId)!;
  const start = "2026-09-15";
  const days = 170;
  const weather: WeatherDayInput[] = [];
  const rain: RainDayInput[] = [];
  for (let d = 0; d < days; d++) {
    const date = addDaysIso(start, d);
    const warm = 24 + 8 * Math.sin((d / 365) * 2 * Math.PI) + 4 * (rnd() - 0.5);
    const day: WeatherDayInput = {
      date,
      tMaxC: Math.round((warm + 6) * 10) / 10,
      tMinC: Math.round((warm - 7) * 10) / 10,
      rhMaxPct: Math.round(70 + 25 * rnd()),
      rhMinPct: Math.round(20 + 30 * rnd()),
      windMs: Math.round((1 + 3 * rnd()) * 10) / 10,
      solarMJm2: Math.round((18 + 12 * rnd()) * 10) / 10,
    };
    if (d % 17 === 5) delete day.solarMJm2;
    if (d % 23 === 7) weather.push({ date, tMaxC: day.tMaxC, tMinC: day.tMinC });
    else if (d !== 60) weather.push(day);
    const u = rnd();
    if (d === 48 || d === 97) {
      let t = Date.parse(`${date}T03:00:00Z`);
      const records = [];
      for (let k = 0; k < 160; k++) {
        t += Math.round(10_000 + 200_000 * rnd() * rnd());
        records.push({ at: t, depthMm: 0.2 });
      }
      rain.push({ date, kind: "records", records, source: { kind: "own-gauge" } });
    } else if (u < 0.18) {
      rain.push({
        date,
        kind: "total",
        rainMm: Math.round(60 * rnd() * rnd() * 10) / 10,
        source: {
          kind: "idw",
          gauges: [
            { gaugeId: "g-north", distanceKm: 1.2, weight: 0.7 },
            { gaugeId: "g-shed", distanceKm: 2.1, weight: 0.3 },
          ],
        },
      });
    }
  }
  return {
    field: {
      soil: { texture: "loam" },
      areaHa: 31.5,
      runoff: { hydrologicSoilGroup: "C", cover: "row-crop-straight-good" },
    },
    planting: {
      plantingDate: "2026-09-20",
      kc: crop.kc,
      stages: crop.stages,
      heightM: crop.heightM,
      rootDepthMinM: crop.rootDepthMinM,
      rootDepthMaxM: crop.rootDepthMaxM,
      pTable: crop.pTable,
      triggerMad: 0.5,
      climateAdjust: true,
      ...(dual ? { dual: { kcb: crop.kcb } } : {}),
    },
    system: { applicationEfficiency: 0.82, wettedFraction: 1 },
    station: { latitudeDeg: -27.55, elevationM: 180, windHeightM: 2 },
    weather,
    rain,
    irrigations: [
      { date: "2026-11-10", depthMm: 35, basis: "gross" },
      { date: "2026-12-05", depthMm: 40, basis: "gross" },
      { date: "2026-12-20", depthMm: 30, basis: "net" },
      { date: "2027-01-12", depthMm: 45, basis: "gross" },
    ],
    soilChecks: [{ date: "2026-12-28", depletionMm: 55 }],
    startDate: start,
    endDate: addDaysIso(start, days - 1),
    initialDepletionMm: 12,
  };
}

type Row = Record<string, string | number | boolean | null>;

function snapshot(days: AccountDay[]): Row[] {
  const r6 = (x: number) => Math.round(x * 1e6) / 1e6;
  return days.map((d) => ({
    date: d.date,
    stage: d.stage,
    etoMm: r6(d.etoMm),
    etoMethod: d.provenance.eto.method,
    estimated: d.provenance.eto.estimated.join(","),
    kc: r6(d.kc),
    ks: r6(d.ks),
    etcAdjMm: r6(d.etcAdjMm),
    rainMm: r6(d.rainMm),
    runoffMm: r6(d.runoffMm),
    runoffMethod: d.provenance.runoff.method,
    irrigationNetMm: r6(d.irrigationNetMm),
    deepPercolationMm: r6(d.deepPercolationMm),
    depletionEndMm: r6(d.depletionEndMm),
    tawMm: r6(d.tawMm),
    rawMm: r6(d.rawMm),
    soilCheckReset: d.soilCheckReset,
  }));
}

describe.each([
  ["maize-single", 7, "maize-grain", false],
  ["tomato-dual", 11, "tomato", true],
] as const)("golden season %s", (name, seed, cropId, dual) => {
  it("matches the reviewed fixture", () => {
    const result = runFieldAccount(season(seed, cropId, dual));
    expect(result.allClose).toBe(true);
    const rows = snapshot(result.days);
    const file = path.join(DIR, `${name}.json`);
    if (UPDATE || !existsSync(file)) {
      if (!UPDATE) throw new Error(`missing golden fixture ${file}; run with UPDATE_GOLDEN=1`);
      mkdirSync(DIR, { recursive: true });
      writeFileSync(file, JSON.stringify({ kcUsed: result.kcUsed, rows }, null, 2) + "\n");
      return;
    }
    const golden = JSON.parse(readFileSync(file, "utf8")) as { rows: Row[] };
    expect(rows.length).toBe(golden.rows.length);
    rows.forEach((row, i) => {
      const g = golden.rows[i]!;
      for (const [k, v] of Object.entries(row)) {
        if (typeof v === "number") expect(v, `${row.date} ${k}`).toBeCloseTo(g[k] as number, 5);
        else expect(v, `${row.date} ${k}`).toBe(g[k]);
      }
    });
  });
});
