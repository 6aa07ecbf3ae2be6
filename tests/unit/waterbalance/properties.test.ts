import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  addDaysIso,
  CROP_LIBRARY,
  curveNumberRunoffMm,
  extraterrestrialRadiationMJm2,
  greenAmptStorm,
  referenceEtDaily,
  runFieldAccount,
  SOIL_TEXTURES,
  type FieldAccountInput,
  type HyetographPiece,
  type RainDayInput,
} from "@/lib/waterbalance";

/** Property checks: common practice, no source — each states an invariant of the balance or a method. */

const START = "2026-09-01";

interface SeasonOptions {
  allowRecords: boolean;
  allowDual: boolean;
  runoff: "any" | "fixed-or-none";
}

function seasonArb(opts: SeasonOptions): fc.Arbitrary<FieldAccountInput> {
  const n = 90;
  const storm = fc.record({
    startMin: fc.integer({ min: 0, max: 1200 }),
    gapsS: fc.array(fc.integer({ min: 2, max: 2400 }), { minLength: 1, maxLength: 200 }),
  });
  return fc
    .record({
      days: fc.integer({ min: 5, max: n }),
      texture: fc.constantFrom(...SOIL_TEXTURES.map((t) => t.id)),
      crop: fc.constantFrom(...CROP_LIBRARY),
      plantingOffset: fc.integer({ min: -30, max: 40 }),
      dual: opts.allowDual ? fc.boolean() : fc.constant(false),
      climate: fc.boolean(),
      eto: fc.array(fc.double({ min: 0, max: 12, noNaN: true }), { minLength: n, maxLength: n }),
      rain: fc.array(
        fc.record({
          day: fc.integer({ min: 0, max: n - 1 }),
          mm: fc.double({ min: 0, max: 150, noNaN: true }),
        }),
        { maxLength: 25 },
      ),
      records: opts.allowRecords
        ? fc.array(fc.record({ day: fc.integer({ min: 0, max: n - 1 }), storm }), { maxLength: 4 })
        : fc.constant([]),
      irrigations: fc.array(
        fc.record({
          day: fc.integer({ min: 0, max: n - 1 }),
          mm: fc.double({ min: 0, max: 80, noNaN: true }),
          basis: fc.constantFrom("gross" as const, "net" as const),
        }),
        { maxLength: 10 },
      ),
      checks: fc.array(
        fc.record({
          day: fc.integer({ min: 0, max: n - 1 }),
          mm: fc.double({ min: 0, max: 300, noNaN: true }),
        }),
        { maxLength: 3 },
      ),
      cr: fc.array(
        fc.record({
          day: fc.integer({ min: 0, max: n - 1 }),
          mm: fc.double({ min: 0, max: 3, noNaN: true }),
        }),
        { maxLength: 5 },
      ),
      initial: fc.double({ min: 0, max: 250, noNaN: true }),
      efficiency: fc.double({ min: 0.3, max: 1, noNaN: true }),
      cn: fc.option(fc.integer({ min: 50, max: 98 }), { nil: undefined }),
      antecedent:
        opts.runoff === "any"
          ? fc.constantFrom("account" as const, "dry" as const, "average" as const, "wet" as const)
          : fc.constantFrom("dry" as const, "average" as const, "wet" as const),
      iaRatio: fc.constantFrom(0.2 as const, 0.05 as const),
    })
    .map((g) => {
      const rainByDay = new Map<number, RainDayInput>();
      for (const r of g.rain) {
        if (r.day < g.days)
          rainByDay.set(r.day, {
            date: addDaysIso(START, r.day),
            kind: "total",
            rainMm: r.mm,
            source: { kind: "own-gauge" },
          });
      }
      for (const r of g.records) {
        if (r.day >= g.days) continue;
        let t = Date.parse(`${addDaysIso(START, r.day)}T00:00:00Z`) + r.storm.startMin * 60_000;
        const records = r.storm.gapsS.map((s) => {
          t += s * 1000;
          return { at: t, depthMm: 0.2 };
        });
        rainByDay.set(r.day, {
          date: addDaysIso(START, r.day),
          kind: "records",
          records,
          source: { kind: "own-gauge" },
        });
      }
      const crop = g.crop;
      const input: FieldAccountInput = {
        field: {
          soil: { texture: g.texture },
          areaHa: 12,
          runoff:
            g.cn === undefined
              ? { dailyMethod: "none" }
              : { curveNumber: g.cn, antecedent: g.antecedent, iaRatio: g.iaRatio },
        },
        planting: {
          plantingDate: addDaysIso(START, g.plantingOffset),
          kc: crop.kc,
          stages: crop.stages,
          heightM: crop.heightM,
          rootDepthMinM: crop.rootDepthMinM,
          rootDepthMaxM: crop.rootDepthMaxM,
          pTable: crop.pTable,
          climateAdjust: g.climate ? { midWindMs: 3, midRhMinPct: 30 } : false,
          ...(g.dual ? { dual: { kcb: crop.kcb } } : {}),
        },
        system: { applicationEfficiency: g.efficiency, wettedFraction: 0.6 },
        weather: g.eto.slice(0, g.days).map((etoMm, d) => ({ date: addDaysIso(START, d), etoMm })),
        rain: [...rainByDay.values()],
        irrigations: g.irrigations
          .filter((i) => i.day < g.days)
          .map((i) => ({ date: addDaysIso(START, i.day), depthMm: i.mm, basis: i.basis })),
        soilChecks: g.checks
          .filter((c) => c.day < g.days)
          .map((c) => ({ date: addDaysIso(START, c.day), depletionMm: c.mm })),
        capillaryRise: g.cr
          .filter((c) => c.day < g.days)
          .map((c) => ({ date: addDaysIso(START, c.day), capillaryRiseMm: c.mm })),
        startDate: START,
        endDate: addDaysIso(START, g.days - 1),
        initialDepletionMm: g.initial,
      };
      return input;
    });
}

describe("the balance on random seasons", () => {
  it("closes its books every day, and depletion stays within 0..TAW", () => {
    fc.assert(
      fc.property(seasonArb({ allowRecords: true, allowDual: true, runoff: "any" }), (input) => {
        const r = runFieldAccount(input);
        expect(r.allClose).toBe(true);
        for (const d of r.days) {
          expect(Math.abs(d.closure.errorMm)).toBeLessThan(1e-9);
          expect(d.depletionStartMm).toBeGreaterThanOrEqual(0);
          expect(d.depletionEndMm).toBeGreaterThanOrEqual(0);
          expect(d.depletionStartMm).toBeLessThanOrEqual(d.tawMm + 1e-9);
          expect(d.depletionEndMm).toBeLessThanOrEqual(d.tawMm + 1e-9);
          expect(d.runoffMm).toBeGreaterThanOrEqual(0);
          expect(d.runoffMm).toBeLessThanOrEqual(d.rainMm + 1e-9);
          expect(d.deepPercolationMm).toBeGreaterThanOrEqual(0);
          expect(d.etcAdjMm).toBeGreaterThanOrEqual(0);
          expect(d.ks).toBeGreaterThanOrEqual(0);
          expect(d.ks).toBeLessThanOrEqual(1);
          expect(d.pAdjusted).toBeGreaterThanOrEqual(0.1);
          expect(d.pAdjusted).toBeLessThanOrEqual(0.8);
        }
      }),
      { numRuns: 150 },
    );
  }, 60_000);

  it("more rain never raises depletion (single Kc, daily totals, fixed antecedent condition)", () => {
    // With the condition taken from the account, the step from one CN form to the next can make a
    // wetter yesterday shed more of today's storm, so this holds for a fixed condition only.
    fc.assert(
      fc.property(
        seasonArb({ allowRecords: false, allowDual: false, runoff: "fixed-or-none" }),
        fc.nat(),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (input, pick, extraMm) => {
          const n = input.weather.length;
          const dayIdx = pick % n;
          const date = addDaysIso(START, dayIdx);
          const rain = input.rain.filter((r) => r.date !== date);
          const existing = input.rain.find((r) => r.date === date);
          const before = existing && existing.kind === "total" ? (existing.rainMm ?? 0) : 0;
          const wetter: FieldAccountInput = {
            ...input,
            rain: [...rain, { date, kind: "total", rainMm: before + extraMm }],
          };
          const drier: FieldAccountInput = {
            ...input,
            rain: [...rain, { date, kind: "total", rainMm: before }],
          };
          const a = runFieldAccount(drier).days;
          const b = runFieldAccount(wetter).days;
          for (let d = 0; d < n; d++)
            expect(b[d]!.depletionEndMm).toBeLessThanOrEqual(a[d]!.depletionEndMm + 1e-9);
        },
      ),
      { numRuns: 150 },
    );
  }, 60_000);
});

const gaParams = fc.record({
  suctionMm: fc.double({ min: 40, max: 320, noNaN: true }),
  ksatMmH: fc.double({ min: 0.3, max: 120, noNaN: true }),
});

describe("runoff methods", () => {
  it("the same storm total at higher intensity never gives less Green-Ampt runoff (uniform storms)", () => {
    fc.assert(
      fc.property(
        gaParams,
        fc.double({ min: 0.01, max: 0.4, noNaN: true }),
        fc.double({ min: 1, max: 150, noNaN: true }),
        fc.double({ min: 0.05, max: 24, noNaN: true }),
        fc.double({ min: 1, max: 20, noNaN: true }),
        (ga, dTheta, totalMm, durH, speedUp) => {
          const slow = greenAmptStorm(
            [{ startMs: 0, endMs: durH * 3_600_000, depthMm: totalMm }],
            ga,
            dTheta,
          );
          const fast = greenAmptStorm(
            [{ startMs: 0, endMs: (durH / speedUp) * 3_600_000, depthMm: totalMm }],
            ga,
            dTheta,
          );
          expect(fast.runoffMm).toBeGreaterThanOrEqual(slow.runoffMm - 1e-9);
        },
      ),
    );
  });

  it("a hyetograph squeezed in time (every intensity raised by the same factor) never gives less runoff", () => {
    fc.assert(
      fc.property(
        gaParams,
        fc.double({ min: 0.01, max: 0.4, noNaN: true }),
        fc.array(
          fc.record({
            gapS: fc.integer({ min: 0, max: 3600 }),
            durS: fc.integer({ min: 5, max: 3600 }),
            mm: fc.double({ min: 0.01, max: 15, noNaN: true }),
          }),
          { minLength: 1, maxLength: 60 },
        ),
        fc.double({ min: 1, max: 10, noNaN: true }),
        (ga, dTheta, shape, k) => {
          const build = (scale: number): HyetographPiece[] => {
            let t = 0;
            return shape.map((p) => {
              t += (p.gapS * 1000) / scale;
              const piece = { startMs: t, endMs: t + (p.durS * 1000) / scale, depthMm: p.mm };
              t = piece.endMs;
              return piece;
            });
          };
          const a = greenAmptStorm(build(1), ga, dTheta);
          const b = greenAmptStorm(build(k), ga, dTheta);
          expect(b.runoffMm).toBeGreaterThanOrEqual(a.runoffMm - 1e-9);
        },
      ),
    );
  });

  it("more rain in a storm never lets less in, and adds no more runoff than the extra rain", () => {
    fc.assert(
      fc.property(
        gaParams,
        fc.double({ min: 0.01, max: 0.4, noNaN: true }),
        fc.array(
          fc.record({
            durS: fc.integer({ min: 5, max: 3600 }),
            mm: fc.double({ min: 0, max: 15, noNaN: true }),
          }),
          { minLength: 1, maxLength: 60 },
        ),
        fc.nat(),
        fc.double({ min: 0, max: 20, noNaN: true }),
        (ga, dTheta, shape, pick, extra) => {
          let t = 0;
          const pieces = shape.map((p) => {
            const piece = { startMs: t, endMs: t + p.durS * 1000, depthMm: p.mm };
            t = piece.endMs;
            return piece;
          });
          const k = pick % pieces.length;
          const more = pieces.map((p, i) => (i === k ? { ...p, depthMm: p.depthMm + extra } : p));
          const a = greenAmptStorm(pieces, ga, dTheta);
          const b = greenAmptStorm(more, ga, dTheta);
          expect(b.infiltrationMm).toBeGreaterThanOrEqual(a.infiltrationMm - 1e-9);
          expect(b.runoffMm - a.runoffMm).toBeLessThanOrEqual(extra + 1e-9);
        },
      ),
    );
  });

  it("curve-number runoff rises with rain and with CN, never by more than the extra rain", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.integer({ min: 30, max: 99 }),
        fc.constantFrom(0.2 as const, 0.05 as const),
        (p, dp, cn, ia) => {
          const q = curveNumberRunoffMm(p, cn, { iaRatio: ia });
          const q2 = curveNumberRunoffMm(p + dp, cn, { iaRatio: ia });
          expect(q2).toBeGreaterThanOrEqual(q);
          expect(q2 - q).toBeLessThanOrEqual(dp + 1e-9);
          expect(curveNumberRunoffMm(p, cn + 1, { iaRatio: ia })).toBeGreaterThanOrEqual(q);
        },
      ),
    );
  });
});

describe("reference ET", () => {
  it("ETo never falls when Rs rises, on days with a growing-season sun (Ra ≥ 30 MJ m⁻² d⁻¹, Tmax ≤ 45 °C, RHmax ≥ 20 %)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -60, max: 60, noNaN: true }),
        fc.integer({ min: 1, max: 365 }),
        fc.double({ min: 0, max: 3000, noNaN: true }),
        fc.double({ min: -10, max: 30, noNaN: true }),
        fc.double({ min: 0, max: 25, noNaN: true }),
        fc.double({ min: 20, max: 100, noNaN: true }),
        fc.double({ min: 0.05, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.double({ min: 0.05, max: 1.1, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        (lat, doy, z, tMin, range, rhMax, rhMinFrac, wind, rsFrac, rsUp) => {
          const ra = extraterrestrialRadiationMJm2(lat, doy);
          fc.pre(ra >= 30);
          const date = addDaysIso("2025-01-01", doy - 1);
          const base = {
            date,
            tMaxC: Math.min(45, tMin + range),
            tMinC: tMin,
            rhMaxPct: rhMax,
            rhMinPct: rhMax * rhMinFrac,
            windMs: wind,
          };
          const site = { latitudeDeg: lat, elevationM: z };
          const rs = rsFrac * 0.75 * ra;
          const a = referenceEtDaily({ ...base, solarMJm2: rs }, site);
          const b = referenceEtDaily({ ...base, solarMJm2: rs + rsUp }, site);
          expect(b.etoRawMm).toBeGreaterThanOrEqual(a.etoRawMm - 1e-12);
        },
      ),
      { numRuns: 500 },
    );
  });

  it("outside that domain FAO-56 eq. 39 itself can lower ETo as Rs rises (documented limit)", () => {
    // A hot, dry day under a low winter sun (54.6°N, 19 December): the extra longwave loss of a
    // clearer sky (eq. 39) outweighs the extra shortwave gain. d Rn / d Rs = 0.77 − 1.35 σT⁴ (0.34 − 0.14 √ea) / Rso
    // is negative whenever Rso is small against the longwave term, so the property is not claimed there.
    const base = { date: "2025-12-19", tMaxC: 26.2, tMinC: 16.3, rhMaxPct: 54, rhMinPct: 7, windMs: 1 };
    const site = { latitudeDeg: 54.6, elevationM: 0 };
    const dull = referenceEtDaily({ ...base, solarMJm2: 1.7 }, site);
    const bright = referenceEtDaily({ ...base, solarMJm2: 3.6 }, site);
    expect(bright.etoRawMm).toBeLessThan(dull.etoRawMm);
  });
});
