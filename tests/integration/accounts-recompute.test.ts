/**
 * The stored account: a recompute writes one closed day per field per day, equal to the engine run on
 * the same inputs; a change rewrites from its date only; marks are cleared by compare-and-set; the
 * queue keeps one waiting job per farm.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { clearDirtyMarks } from "@/db/accounts";
import { db } from "@/db/knex";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { farmsAtLocalHour, runNightly } from "@/lib/jobs/nightly";
import { JOBS, queue } from "@/lib/jobs/queue";
import { runRecomputeJob } from "@/lib/jobs/recompute";
import {
  addDaysIso,
  groupRecordsByAccountDay,
  rainFromGauges,
  runFieldAccount,
  type AccountDay,
  type DailyWeather,
  type FieldAccountInput,
  type RainDayInput,
} from "@/lib/waterbalance";
import {
  createAccountFarm, CROP, dayDate, FIELDS, FLAGGED_WEATHER_DAY, G1_RAIN, G2_RAIN, GAUGES, SOIL, SPAN_DAYS, STATION, tipInstants, TZ, weatherOf,
  type AccountFarm,
} from "./accounts-fixture";

let farm: AccountFarm;

beforeAll(async () => {
  farm = await createAccountFarm();
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false, wait: true });
  await db.destroy();
});

type Stored = Record<string, number | string | boolean | null | Record<string, unknown>>;
/** A field's stored days, each with its provenance document (kept once per field in account_provenance). */
const storedDays = async (fieldId: string): Promise<Stored[]> =>
  (await db("account_days as a")
    .leftJoin("account_provenance as p", (j) => j.on("p.field_id", "a.field_id").andOn("p.id", "a.provenance_id"))
    .where("a.field_id", fieldId)
    .orderBy("a.date")
    .select("a.*", "p.doc as provenance")) as Stored[];

/** The engine's input for a fixture field, written out by hand from the fixture's values (not through the loader). */
function engineInput(which: "a" | "b" | "c", extraG1: Record<number, number> = {}): FieldAccountInput {
  const weather: DailyWeather[] = [];
  for (let i = 0; i < SPAN_DAYS; i++) {
    if (i === FLAGGED_WEATHER_DAY) continue; // flagged, and the farm does not count flagged values
    const w = weatherOf(i);
    weather.push({
      date: dayDate(farm.start, i), tMaxC: w.tmax_c, tMinC: w.tmin_c, rhMaxPct: w.rh_max_pct, rhMinPct: w.rh_min_pct, windMs: w.wind_ms,
      ...(w.solar_mj_m2 !== null ? { solarMJm2: w.solar_mj_m2 } : {}),
    });
  }
  const g1 = { ...G1_RAIN, ...extraG1 };
  const rain: RainDayInput[] = [];
  for (let i = 0; i < SPAN_DAYS; i++) {
    const date = dayDate(farm.start, i);
    if (which === "a") rain.push({ date, kind: "total", rainMm: g1[i] ?? 0 });
    if (which === "b") {
      const g3mm = (tipInstants(farm.start, i).length * 0.2);
      const r = rainFromGauges({ latitudeDeg: FIELDS.b.centroid_lat, longitudeDeg: FIELDS.b.centroid_lon }, [
        { gaugeId: "g1", latitudeDeg: GAUGES.g1.latitude, longitudeDeg: GAUGES.g1.longitude, rainMm: g1[i] ?? 0 },
        { gaugeId: "g2", latitudeDeg: GAUGES.g2.latitude, longitudeDeg: GAUGES.g2.longitude, rainMm: G2_RAIN[i] ?? null },
        { gaugeId: "g3", latitudeDeg: GAUGES.g3.latitude, longitudeDeg: GAUGES.g3.longitude, rainMm: g3mm },
      ], { radiusKm: 10 });
      rain.push({ date, kind: "total", rainMm: r.rainMm });
    }
  }
  if (which === "c") {
    const records = [...Array(SPAN_DAYS).keys()].flatMap((i) => tipInstants(farm.start, i).map((at) => ({ at, depthMm: 0.2 })));
    for (const g of groupRecordsByAccountDay(records, TZ, 9)) rain.push({ date: g.date, kind: "records", records: g.records });
  }
  const f = FIELDS[which];
  return {
    field: {
      soil: { texture: "loam", thetaFc: SOIL.theta_fc, thetaWp: SOIL.theta_wp, greenAmpt: {} },
      areaHa: f.area_ha,
      ...(f.slope_pct !== null ? { slopePct: f.slope_pct } : {}),
      runoff: { hydrologicSoilGroup: "B", cover: "row-crop-straight-good" },
    },
    planting: {
      plantingDate: farm.start,
      kc: { ini: CROP.kc_ini, mid: CROP.kc_mid, end: CROP.kc_end },
      stages: { iniDays: CROP.stages[0], devDays: CROP.stages[1], midDays: CROP.stages[2], lateDays: CROP.stages[3] },
      heightM: 2,
      rootDepthMinM: CROP.root_min_m,
      rootDepthMaxM: CROP.root_max_m,
      pTable: CROP.p,
      climateAdjust: true,
      ...(which === "b" ? { triggerMad: 0.4 } : {}),
    },
    system: { applicationEfficiency: { a: 0.85, b: 0.9, c: 0.7 }[which] },
    station: { latitudeDeg: STATION.latitude, elevationM: STATION.elevation_m, coastal: false, windHeightM: 2 },
    weather,
    rain,
    irrigations: {
      a: [{ date: dayDate(farm.start, 25), depthMm: 25, basis: "gross" as const }],
      b: [{ date: dayDate(farm.start, 30), depthMm: 20, basis: "net" as const }],
      c: [{ date: dayDate(farm.start, 20), depthMm: 30, basis: "gross" as const }],
    }[which],
    soilChecks: which === "b" ? [{ date: dayDate(farm.start, 40), depletionMm: 35 }] : [],
    startDate: farm.start,
    endDate: farm.yesterday,
    initialDepletionMm: { a: 10, b: 0, c: 20 }[which],
  };
}

function expectSameDay(stored: Stored, day: AccountDay): void {
  const pairs: [string, number][] = [
    ["eto_mm", day.etoMm], ["kc", day.kc], ["etc_mm", day.etcMm], ["ks", day.ks], ["et_actual_mm", day.etcAdjMm], ["rain_mm", day.rainMm],
    ["runoff_mm", day.runoffMm], ["effective_rain_mm", day.effectiveRainMm], ["irrigation_gross_mm", day.irrigationGrossMm],
    ["irrigation_net_mm", day.irrigationNetMm], ["deep_percolation_mm", day.deepPercolationMm], ["depletion_start_mm", day.depletionStartMm],
    ["depletion_end_mm", day.depletionEndMm], ["taw_mm", day.tawMm], ["raw_mm", day.rawMm], ["p_adjusted", day.pAdjusted], ["root_depth_m", day.rootDepthM],
  ];
  for (const [column, value] of pairs) expect(stored[column], `${String(stored.date)} ${column}`).toBeCloseTo(value, 9);
  expect(stored.soil_check_reset).toBe(day.soilCheckReset);
}

describe("recompute of a farm", () => {
  it("writes one row per field per day, each closing its books within 0.01 mm, and clears the marks", async () => {
    const result = await recomputeFarm(farm.farmId, { today: farm.today });
    expect(result.skipped).toEqual([]);
    expect(result.fields).toBe(3);
    expect(result.days).toBe(3 * SPAN_DAYS);
    const counts = (await db("account_days").whereIn("field_id", [farm.ids.a, farm.ids.b, farm.ids.c]).groupBy("field_id").select("field_id").count("* as n")) as { n: number }[];
    expect(counts.map((c) => Number(c.n))).toEqual([SPAN_DAYS, SPAN_DAYS, SPAN_DAYS]);
    // Closure from the stored columns alone (DESIGN.md invariant; FAO-56 eq. 85).
    const worst = await db.raw<{ rows: { err: number }[] }>(
      `select max(abs((depletion_start_mm - depletion_end_mm) - (effective_rain_mm + irrigation_net_mm + capillary_rise_mm - et_actual_mm - deep_percolation_mm))) as err
         from account_days where field_id = any(?::uuid[])`,
      [[farm.ids.a, farm.ids.b, farm.ids.c]],
    );
    expect(worst.rows[0]!.err).toBeLessThanOrEqual(0.01);
    const dirty = await db("fields").where({ farm_id: farm.farmId }).whereNotNull("account_dirty_from").count("* as n");
    expect(Number(dirty[0]!.n)).toBe(0);
  });

  it.each(["a", "b", "c"] as const)("stores for field %s exactly what the engine computes from the same inputs", async (which) => {
    const engine = runFieldAccount(engineInput(which));
    expect(engine.allClose).toBe(true);
    const stored = await storedDays(farm.ids[which]);
    expect(stored.map((r) => r.date)).toEqual(engine.days.map((d) => d.date));
    stored.forEach((row, k) => expectSameDay(row, engine.days[k]!));
  });

  it("records provenance: ETo method and estimates, rain source with gauges and weights, runoff method, QC", async () => {
    const [a, b, c] = await Promise.all([storedDays(farm.ids.a), storedDays(farm.ids.b), storedDays(farm.ids.c)]);
    const prov = (rows: Stored[], i: number) => rows[i]!.provenance as Record<string, Record<string, unknown>>;
    expect(prov(a, 3).eto).toEqual({ method: "penman-monteith", estimated: ["solar"] });
    expect(prov(a, FLAGGED_WEATHER_DAY).eto).toMatchObject({ method: "filled-mean" });
    expect(prov(a, FLAGGED_WEATHER_DAY).qc).toEqual(["weather-flagged-excluded"]);
    expect(prov(a, 5).rain).toMatchObject({ source: "own-gauge", gauges: [{ gaugeId: farm.ids.g1, weight: 1 }] });
    expect(prov(a, 5).runoff).toMatchObject({ method: "curve-number" });
    const idw = prov(b, 17).rain as { source: string; gauges: { weight: number }[] };
    expect(idw.source).toBe("idw");
    expect(idw.gauges).toHaveLength(3);
    expect(idw.gauges.reduce((s, g) => s + g.weight, 0)).toBeCloseTo(1, 12);
    expect(prov(c, 17).runoff).toMatchObject({ method: "green-ampt" });
    expect(prov(c, 17).rain).toMatchObject({ source: "own-gauge", recorded: true });
    expect(b[40]!.soil_check_reset).toBe(true);
    expect(prov(b, 40)).toHaveProperty("carriedDepletionMm");
  });

  it("rewrites from a changed day only, leaving earlier rows untouched, and matches a full rewrite", async () => {
    const before = await storedDays(farm.ids.a);
    const changed = 30;
    await db.transaction(async (trx) => {
      await trx("rain_readings").where({ gauge_id: farm.ids.g1, rain_date: dayDate(farm.start, changed) }).update({ depth_mm: 18.6 });
      await markFieldsDirty(trx, { fieldIds: [farm.ids.a] }, dayDate(farm.start, changed));
    });
    const otherBefore = await storedDays(farm.ids.c);
    const result = await recomputeFarm(farm.farmId, { today: farm.today });
    expect(result.fields).toBe(1);
    expect(result.days).toBe(SPAN_DAYS - changed);
    const after = await storedDays(farm.ids.a);
    expect(after.slice(0, changed)).toEqual(before.slice(0, changed));
    expect(after[changed]!.rain_mm).toBe(18.6);
    expect(after[changed]!.computed_at).not.toEqual(before[changed]!.computed_at);
    expect(await storedDays(farm.ids.c)).toEqual(otherBefore);
    // The carried-in start equals what a whole-season engine run gives with the new reading.
    const engine = runFieldAccount(engineInput("a", { [changed]: 18.6 }));
    after.forEach((row, k) => expectSameDay(row, engine.days[k]!));
  });

  it("clears a mark only when no change arrived since it was read (compare-and-set)", async () => {
    await markFieldsDirty(db, { fieldIds: [farm.ids.b] }, dayDate(farm.start, 50));
    const seen = (await db("fields").where({ id: farm.ids.b }).first("account_dirty_seq")) as { account_dirty_seq: number };
    // A later change lands while a run holds the old counter: least() keeps the date, the counter moves.
    await markFieldsDirty(db, { fieldIds: [farm.ids.b] }, dayDate(farm.start, 55));
    expect(await clearDirtyMarks(db, [{ fieldId: farm.ids.b, seq: Number(seen.account_dirty_seq) }])).toEqual([]);
    const still = (await db("fields").where({ id: farm.ids.b }).first("account_dirty_from", "account_dirty_seq")) as { account_dirty_from: string; account_dirty_seq: number };
    expect(still.account_dirty_from).toBe(dayDate(farm.start, 50));
    expect(await clearDirtyMarks(db, [{ fieldId: farm.ids.b, seq: Number(still.account_dirty_seq) }])).toEqual([farm.ids.b]);
  });

  it("runs as the recompute job, and the queue keeps one waiting job per farm", async () => {
    await markFieldsDirty(db, { fieldIds: [farm.ids.c] }, dayDate(farm.start, 45));
    await requestRecompute(farm.farmId);
    await requestRecompute(farm.farmId);
    await requestRecompute(farm.farmId);
    const waiting = await db.raw<{ rows: { n: number }[] }>(
      "select count(*)::int as n from jobs.job where name = ? and singleton_key = ? and state = 'created'",
      [JOBS.recompute, farm.farmId],
    );
    expect(waiting.rows[0]!.n).toBe(1);
    const result = await runRecomputeJob({ farmId: farm.farmId });
    expect(result.fields).toBe(1);
  });
});

describe("nightly", () => {
  it("picks the farms whose local hour is 02 (Sydney is UTC+11 in December)", async () => {
    const at = new Date("2026-12-01T15:10:00Z");
    expect(await farmsAtLocalHour(2, at)).toContain(farm.farmId);
    expect(await farmsAtLocalHour(3, at)).not.toContain(farm.farmId);
  });

  it("adds the day just ended, refreshes the outlook and reports fields at their trigger", async () => {
    // a forecast service that answers with the same invented days every night
    const provider = {
      name: "nightly-test",
      daily: async (q: { days: number; start: string }) =>
        Array.from({ length: q.days }, (_, k) => ({ date: addDaysIso(q.start, k), tmaxC: 30, tminC: 15, rhMaxPct: 80, rhMinPct: 30, windMs: 2, solarMJm2: 25, rainMm: 0 })),
    };
    const night = await runNightly(farm.farmId, farm.today, { forecastProvider: provider });
    expect("stations" in night.forecast && night.forecast.stations.map((s) => s.days)).toEqual([7]);
    const stored = await db("weather_days").where({ station_id: farm.ids.station, kind: "forecast", source: "nightly-test" }).count("* as n");
    expect(Number(stored[0]!.n)).toBe(7);
    expect(night.recompute.fields).toBe(3);
    expect(night.recompute.days).toBe(3);
    expect(night.outlooks.map((o) => o.fieldId).sort()).toEqual([farm.ids.a, farm.ids.b, farm.ids.c].sort());
    const last = (await db("account_days as a").join("plantings as p", "p.id", "a.planting_id")
      .whereIn("a.field_id", [farm.ids.a, farm.ids.b, farm.ids.c]).where("a.date", farm.yesterday)
      .select("a.field_id", "a.depletion_end_mm", "a.raw_mm", "a.taw_mm", "p.mad")) as { field_id: string; depletion_end_mm: number; raw_mm: number; taw_mm: number; mad: number | null }[];
    const atTrigger = last.filter((r) => r.depletion_end_mm >= (r.mad !== null ? r.mad * r.taw_mm : r.raw_mm)).map((r) => r.field_id);
    const noted = night.alerts.filter((n) => n.kind !== "due-soon").map((n) => n.fieldId);
    expect(noted.sort()).toEqual(atTrigger.sort());
  });
});
