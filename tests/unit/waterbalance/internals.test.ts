import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  addDaysIso,
  buildHyetograph,
  computeFieldSeason,
  computeStationEto,
  dayNumberToIsoDate,
  dayOfYear,
  hyetographColumns,
  isoDateToDayNumber,
  maxDepthInWindowMm,
  runFieldAccount,
  separateStorms,
  stormBounds,
  WaterBalanceInputError,
  type HyetographPiece,
  type WeatherDayInput,
} from "@/lib/waterbalance";
import { plainField, seededRandom } from "./helpers";

/** Checks of the engine's own machinery: common practice, no source. */

describe("dates", () => {
  it("round-trips ISO dates and day numbers, leap days included", () => {
    for (const iso of ["1970-01-01", "2000-02-29", "2024-02-29", "2026-11-30", "2100-03-01", "1969-12-31"]) {
      expect(dayNumberToIsoDate(isoDateToDayNumber(iso))).toBe(iso);
      expect(isoDateToDayNumber(iso)).toBe(Math.round(Date.parse(`${iso}T00:00:00Z`) / 86_400_000));
    }
    expect(dayOfYear("2024-12-31")).toBe(366);
    expect(dayOfYear("2026-07-06")).toBe(187); // FAO-56 Annex 2 Table 2.5: 6 July is day 187
    expect(() => isoDateToDayNumber("2026-02-29")).toThrow(WaterBalanceInputError);
    expect(() => isoDateToDayNumber("2026-11-30T00:00")).toThrow(/ISO date/);
  });
});

describe("season columns", () => {
  it("two seasons computed one after the other do not share memory", () => {
    const a = plainField({}, 30);
    const b = plainField({ initialDepletionMm: 80 }, 30, 7);
    const alone = runFieldAccount(a).days.map((d) => d.depletionEndMm);
    const colsA = computeFieldSeason(a);
    const colsB = computeFieldSeason(b);
    expect(Array.from(colsA.loop.depletionEndMm)).toEqual(alone);
    expect(colsB.loop.depletionEndMm[0]).not.toBe(colsA.loop.depletionEndMm[0]);
    expect(Array.from(colsA.crop.kc).every((k) => k === 1)).toBe(true);
  });

  it("a station's ETo series gives the same account as raw weather per field", () => {
    const rnd = seededRandom(3);
    const weather: WeatherDayInput[] = Array.from({ length: 40 }, (_, d) => ({
      date: addDaysIso("2026-11-01", d),
      tMaxC: 28 + 5 * rnd(),
      tMinC: 14 + 3 * rnd(),
      rhMaxPct: 80,
      rhMinPct: 35,
      windMs: 2 + rnd(),
      ...(d % 9 === 4 ? {} : { solarMJm2: 20 + 8 * rnd() }),
    }));
    const station = { latitudeDeg: -30, elevationM: 200 };
    const base = plainField({ weather, station }, 30);
    const eto = computeStationEto(weather, station, "2026-10-28", "2026-12-15");
    const viaSeries = runFieldAccount({ ...base, eto });
    const direct = runFieldAccount(base);
    expect(viaSeries.days.map((d) => [d.etoMm, d.provenance.eto])).toEqual(
      direct.days.map((d) => [d.etoMm, d.provenance.eto]),
    );
    expect(() =>
      runFieldAccount({ ...base, eto: computeStationEto(weather, station, "2026-11-05", "2026-11-20") }),
    ).toThrow(/does not cover/);
  });

  it("fills days without weather with the recent mean, and days before the first with the first days' mean", () => {
    const input = plainField({}, 6);
    input.weather = [
      { date: "2026-11-03", etoMm: 3 },
      { date: "2026-11-04", etoMm: 5 },
      { date: "2026-11-06", etoMm: 7 },
    ];
    const r = runFieldAccount(input);
    expect(r.days.map((d) => d.etoMm)).toEqual([5, 5, 3, 5, 4, 7]);
    expect(r.days.map((d) => d.provenance.eto.method)).toEqual([
      "filled-mean",
      "filled-mean",
      "given",
      "given",
      "filled-mean",
      "given",
    ]);
  });
});

describe("hyetograph forms agree", () => {
  const recordsArb = fc.array(
    fc.record({
      gapS: fc.integer({ min: 0, max: 30_000 }),
      interval: fc.option(fc.integer({ min: 1, max: 30 }), { nil: undefined }),
    }),
    {
      minLength: 1,
      maxLength: 120,
    },
  );

  it("columns, pieces and storms describe the same rain", () => {
    fc.assert(
      fc.property(recordsArb, fc.double({ min: 0.5, max: 8, noNaN: true }), (spec, gapH) => {
        let t = Date.UTC(2026, 10, 1);
        const records = spec.map((s) => {
          t += s.gapS * 1000;
          return s.interval === undefined
            ? { at: t, depthMm: 0.2 }
            : { at: t, depthMm: 1, intervalMin: s.interval };
        });
        const { hyetograph } = hyetographColumns(records);
        const { pieces } = buildHyetograph(records);
        expect(pieces.length).toBe(hyetograph.n);
        const total = records.reduce((a, r) => a + r.depthMm, 0);
        const kept = pieces.reduce((a, p) => a + p.depthMm, 0);
        expect(kept).toBeLessThanOrEqual(total + 1e-9);
        for (let k = 1; k < pieces.length; k++)
          expect(pieces[k]!.startMs).toBeGreaterThanOrEqual(pieces[k - 1]!.endMs);
        const storms = separateStorms(pieces, { dryGapH: gapH });
        const bounds = stormBounds(hyetograph, gapH);
        expect(bounds.length / 2).toBe(storms.length);
        storms.forEach((s, i) => expect(bounds[2 * i + 1]! - bounds[2 * i]!).toBe(s.pieces.length));
      }),
    );
  }, 30_000);

  it("the O(n) 30-minute window matches a brute-force scan", () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            gapS: fc.integer({ min: 0, max: 3600 }),
            durS: fc.integer({ min: 1, max: 3600 }),
            mm: fc.double({ min: 0, max: 20, noNaN: true }),
          }),
          { minLength: 1, maxLength: 25 },
        ),
        fc.integer({ min: 5, max: 60 }),
        (spec, windowMin) => {
          let t = 0;
          const pieces: HyetographPiece[] = spec.map((p) => {
            t += p.gapS * 1000;
            const piece = { startMs: t, endMs: t + p.durS * 1000, depthMm: p.mm };
            t = piece.endMs;
            return piece;
          });
          const cum = (x: number) =>
            pieces.reduce(
              (a, p) =>
                a +
                (x <= p.startMs
                  ? 0
                  : x >= p.endMs
                    ? p.depthMm
                    : (p.depthMm * (x - p.startMs)) / (p.endMs - p.startMs)),
              0,
            );
          const w = windowMin * 60_000;
          let brute = 0;
          const points = pieces.flatMap((p) => [p.startMs, p.endMs, p.startMs - w, p.endMs - w]);
          for (const x of points) brute = Math.max(brute, cum(x + w) - cum(x));
          expect(maxDepthInWindowMm(pieces, windowMin)).toBeCloseTo(brute, 9);
          // and no window position on a fine grid beats it
          const end = pieces[pieces.length - 1]!.endMs;
          for (let x = -w; x <= end; x += Math.max(1000, Math.floor((end + w) / 60))) {
            expect(cum(x + w) - cum(x)).toBeLessThanOrEqual(maxDepthInWindowMm(pieces, windowMin) + 1e-9);
          }
        },
      ),
    );
  }, 30_000);
});
