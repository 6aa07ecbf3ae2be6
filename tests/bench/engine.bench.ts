/**
 * Engine throughput. Run: npx tsx tests/bench/engine.bench.ts (pin to one core: taskset -c 0 npx tsx …)
 * Prints three figures with their targets: a whole-farm season recompute (2,000 fields × 365 days with
 * ETo from raw station weather, runoff by curve number or Green-Ampt, and the balance), the balance
 * loop alone in field-days per second, and one Green-Ampt storm of 1,000 tips. Data come from a
 * seeded PRNG, so every run sees the same farm. Targets are judged on this process's CPU time (the
 * one-core figure); wall time is printed beside it and only agrees when the machine is otherwise quiet.
 * Not a vitest test: no timing is asserted anywhere in the test suite.
 */
import { loadavg } from "node:os";
import {
  addDaysIso,
  balanceLoop,
  buildHyetograph,
  computeFieldSeason,
  computeStationEto,
  createBalanceLoopOutput,
  CROP_LIBRARY,
  greenAmptStorm,
  runFieldAccount,
  SOIL_TEXTURES,
  RUNOFF_CURVE_NUMBER,
  type BalanceLoopInput,
  type DailyWeather,
  type FieldAccountInput,
  type RainDayInput,
  type RainRecord,
} from "../../lib/waterbalance";

const FIELDS = 2000;
const DAYS = 365;
const START = "2026-07-01";
const RECORDING_SHARE = 0.15;

function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rnd = mulberry32(20261130);
const dates = Array.from({ length: DAYS }, (_, d) => addDaysIso(START, d));

/** Eight weather stations: where they stand, and a year of raw daily readings. */
const stationSites = Array.from({ length: 8 }, (_, s) => ({
  latitudeDeg: -27.5 + 0.1 * s,
  elevationM: 150 + 25 * s,
}));
const stations = Array.from({ length: 8 }, (_, s) =>
  dates.map((date, d): DailyWeather => {
    const season = Math.cos(((d - 190) / 365) * 2 * Math.PI);
    const t = 22 + 7 * season + 4 * (rnd() - 0.5) + s * 0.2;
    return {
      date,
      tMaxC: t + 6,
      tMinC: t - 7,
      rhMaxPct: 70 + 25 * rnd(),
      rhMinPct: 20 + 30 * rnd(),
      windMs: 1 + 3 * rnd(),
      solarMJm2: rnd() < 0.05 ? undefined : 15 + 12 * rnd() + 4 * season,
    };
  }),
);

/** One storm day of bucket tips: bursts of 0.2 mm tips, 2 s to 10 min apart. */
function stormRecords(date: string, tips: number, r: () => number): RainRecord[] {
  let t = Date.parse(`${date}T02:00:00Z`);
  const out: RainRecord[] = [];
  for (let k = 0; k < tips; k++) {
    t += Math.round(2_000 + 600_000 * r() * r() * r());
    out.push({ at: t, depthMm: 0.2 });
  }
  return out;
}

function makeField(f: number): FieldAccountInput {
  const r = mulberry32(1000 + f);
  const crop = CROP_LIBRARY[f % CROP_LIBRARY.length]!;
  const texture = SOIL_TEXTURES[f % SOIL_TEXTURES.length]!;
  const recording = r() < RECORDING_SHARE;
  const rain: RainDayInput[] = [];
  for (let d = 0; d < DAYS; d++) {
    if (r() > 0.16) continue;
    const date = dates[d]!;
    const mm = Math.round(50 * r() * r() * 10) / 10;
    if (recording && mm >= 2) {
      rain.push({
        date,
        kind: "records",
        records: stormRecords(date, Math.round(mm / 0.2), r),
        source: { kind: "own-gauge" },
      });
    } else {
      rain.push({
        date,
        kind: "total",
        rainMm: mm,
        source: {
          kind: "idw",
          gauges: [
            { gaugeId: `g${f % 12}`, distanceKm: 1.5, weight: 0.6 },
            { gaugeId: `g${(f + 1) % 12}`, distanceKm: 2.5, weight: 0.4 },
          ],
        },
      });
    }
  }
  const irrigations = [];
  for (let d = 20; d < DAYS; d += 9 + Math.floor(r() * 6))
    irrigations.push({ date: dates[d]!, depthMm: 25 + 15 * r(), basis: "gross" as const });
  return {
    field: {
      soil: { texture: texture.id },
      areaHa: 5 + 60 * r(),
      runoff: { hydrologicSoilGroup: (["A", "B", "C", "D"] as const)[f % 4] },
    },
    planting: {
      plantingDate: dates[Math.floor(r() * 60)]!,
      kc: crop.kc,
      stages: crop.stages,
      heightM: crop.heightM,
      rootDepthMinM: crop.rootDepthMinM,
      rootDepthMaxM: crop.rootDepthMaxM,
      pTable: crop.pTable,
      climateAdjust: true,
    },
    system: { applicationEfficiency: 0.75 + 0.2 * r() },
    station: stationSites[f % stationSites.length]!,
    weather: stations[f % stations.length]!,
    rain,
    irrigations,
    soilChecks: [{ date: dates[100 + (f % 50)]!, depletionMm: 30 }],
    startDate: START,
    endDate: dates[DAYS - 1]!,
    initialDepletionMm: 10,
  };
}

interface Timing {
  /** median wall-clock time of one repeat, ms */
  wallMs: number;
  /** median CPU time (user + system) of this process for one repeat, ms: the one-core figure */
  cpuMs: number;
}

/** Runs `fn` once to warm the JIT, then `repeats` times; medians of wall and CPU time. */
function time(fn: () => void, repeats: number): Timing {
  fn();
  const walls: number[] = [];
  const cpus: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    fn();
    walls.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpus.push((c.user + c.system) / 1000);
  }
  const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  return { wallMs: median(walls), cpuMs: median(cpus) };
}

function fmt(n: number): string {
  return n.toLocaleString("en-AU", { maximumFractionDigits: 0 });
}

const farm = Array.from({ length: FIELDS }, (_, f) => makeField(f));
const recordingFields = farm.filter((f) => f.rain.some((r) => r.kind === "records")).length;
const tipsTotal = farm.reduce(
  (s, f) => s + f.rain.reduce((t, r) => t + (r.kind === "records" ? r.records.length : 0), 0),
  0,
);

// 1. whole-farm season recompute. ETo is computed once per station-day and shared by the fields on
// that station (as the data layer does); the per-field variant is timed too, for comparison.
let checksum = 0;
const END = dates[DAYS - 1]!;
const shareStationEto = () => {
  const etos = stations.map((w, s) => computeStationEto(w, stationSites[s], START, END));
  for (let f = 0; f < farm.length; f++) farm[f]!.eto = etos[f % etos.length];
};
const seasonColumns = time(() => {
  shareStationEto();
  for (const f of farm) checksum += computeFieldSeason(f).finalDepletionMm;
}, 5);
const seasonRows = time(() => {
  shareStationEto();
  for (const f of farm) checksum += runFieldAccount(f).finalDepletionMm;
}, 5);
const seasonPerFieldEto = time(() => {
  for (const f of farm) {
    f.eto = undefined;
    checksum += computeFieldSeason(f).finalDepletionMm;
  }
}, 3);

// 2. the balance loop alone, on prepared arrays with curve-number runoff
const prepared = farm.slice(0, 200).map((f) => {
  const copy: FieldAccountInput = Object.assign({}, f);
  copy.rain = f.rain.filter((r) => r.kind === "total");
  return computeFieldSeason(copy);
});
const loopInputs: BalanceLoopInput[] = prepared.map((c) => ({
  nDays: c.crop.n,
  initialDepletionMm: 10,
  etoMm: c.crop.etoMm,
  kc: c.crop.kc,
  tawMm: c.crop.tawMm,
  pTable: c.crop.pTable,
  rainMm: c.water.rainMm,
  irrigationNetMm: c.water.irrigationNetMm,
  capillaryRiseMm: c.water.capillaryRiseMm,
  soilCheckMm: c.water.soilCheckMm,
  runoffKind: new Uint8Array(c.crop.n).fill(RUNOFF_CURVE_NUMBER),
  curveNumber: c.water.curveNumber,
  stormRunoff: null,
  dual: null,
}));
const out = createBalanceLoopOutput(DAYS);
const LOOP_PASSES = 50;
const loop = time(() => {
  for (let p = 0; p < LOOP_PASSES; p++) for (const li of loopInputs) checksum += balanceLoop(li, out);
}, 5);
const loopFieldDays = loopInputs.length * DAYS * LOOP_PASSES;

// 3. one Green-Ampt storm of 1,000 tips (hyetograph from tips, then infiltration with ponding)
const tipRecords = stormRecords("2026-12-01", 1000, mulberry32(7));
const loam = SOIL_TEXTURES.find((t) => t.id === "loam")!.greenAmpt;
const STORM_REPS = 200;
const storm = time(() => {
  for (let i = 0; i < STORM_REPS; i++) {
    const { pieces } = buildHyetograph(tipRecords);
    checksum += greenAmptStorm(pieces, loam, 0.2).runoffMm;
  }
}, 5);

const ok = (pass: boolean) => (pass ? "meets target" : "MISSES target");
const fieldDays = FIELDS * DAYS;
const both = (t: Timing) => `${t.cpuMs.toFixed(0)} ms CPU (${t.wallMs.toFixed(0)} ms wall)`;
console.log(
  `Rootbank engine benchmark — node ${process.version}, one JS thread; load average ${loadavg()
    .map((x) => x.toFixed(1))
    .join(" ")}`,
);
console.log(
  `farm: ${fmt(FIELDS)} fields x ${DAYS} days on ${stations.length} weather stations (raw readings, ETo by FAO-56); ${recordingFields} fields on a recording gauge (${fmt(tipsTotal)} tips through Green-Ampt); the rest by curve number`,
);
console.log(
  `targets are judged on CPU time, the one-core figure; wall time suffers when other work shares the machine`,
);
console.log(
  `1. whole-farm season recompute (ETo + runoff + balance), columns: ${both(seasonColumns)} = ${fmt(fieldDays / (seasonColumns.cpuMs / 1000))} field-days/s — target < 1000 ms: ${ok(seasonColumns.cpuMs < 1000)}`,
);
console.log(
  `   the same with account rows and provenance (runFieldAccount):  ${both(seasonRows)} = ${fmt(fieldDays / (seasonRows.cpuMs / 1000))} field-days/s — target < 1000 ms: ${ok(seasonRows.cpuMs < 1000)}`,
);
console.log(
  `   columns again with ETo recomputed for every field (no sharing): ${both(seasonPerFieldEto)} = ${fmt(fieldDays / (seasonPerFieldEto.cpuMs / 1000))} field-days/s (for comparison)`,
);
const loopRate = loopFieldDays / (loop.cpuMs / 1000);
console.log(
  `2. balance loop alone: ${fmt(loopRate)} field-days/s CPU (${fmt(loopFieldDays / (loop.wallMs / 1000))} wall) — target >= 5,000,000: ${ok(loopRate >= 5e6)}`,
);
console.log(
  `3. one Green-Ampt storm of 1,000 tips (tips to hyetograph + infiltration): ${((storm.cpuMs * 1000) / STORM_REPS).toFixed(0)} µs CPU (${((storm.wallMs * 1000) / STORM_REPS).toFixed(0)} µs wall) = ${fmt(STORM_REPS / (storm.cpuMs / 1000))} storms/s`,
);
console.log(`(checksum ${checksum.toFixed(3)})`);
