/** Each quality-control rule on its own: pure functions, no database. */
import { describe, expect, it } from "vitest";
import {
  neighbourFlags,
  QC_LIMITS,
  tipFlags,
  weatherDayFlags,
  type GaugeDay,
  type TipQc,
  type WeatherDayQc,
} from "@/lib/qc/rules";

const day = (over: Partial<WeatherDayQc> = {}): WeatherDayQc => ({
  id: "w1",
  date: "2026-11-20",
  tmaxC: 30,
  tminC: 15,
  rhMaxPct: 85,
  rhMinPct: 30,
  windMs: 2.5,
  solarMJm2: 25,
  rainMm: 0,
  latitude: -34.4,
  elevationM: 120,
  ...over,
});
const rules = (d: WeatherDayQc) => weatherDayFlags(d).map((f) => f.rule);

describe("weather day ranges (common practice, no source)", () => {
  it("leaves an ordinary summer day alone", () => {
    expect(weatherDayFlags(day())).toEqual([]);
  });

  it("flags each value outside its range, keeping the value's own words", () => {
    expect(rules(day({ rainMm: 300 }))).toEqual(["rain_range"]);
    expect(rules(day({ tmaxC: 52 }))).toEqual(["temperature_range"]);
    expect(rules(day({ tminC: -35, tmaxC: -20 }))).toEqual(["temperature_range"]);
    expect(rules(day({ tmaxC: 40, tminC: 5 }))).toEqual(["temperature_range"]); // a 35 °C range
    expect(rules(day({ rhMinPct: 1 }))).toEqual(["humidity_range"]);
    expect(rules(day({ rhMaxPct: 12, rhMinPct: 5 }))).toEqual(["humidity_range"]);
    expect(rules(day({ windMs: 18 }))).toEqual(["wind_range"]);
    expect(rules(day({ rhMaxPct: 100, rhMinPct: 100 }))).toEqual(["humidity_stuck"]);
    expect(rules(day({ rhMaxPct: 100, rhMinPct: 100, rainMm: 25 }))).toEqual([]); // a wet day may stay saturated
    expect(weatherDayFlags(day({ windMs: 18 }))[0]).toMatchObject({
      entity: "weather_day",
      entityId: "w1",
      date: "2026-11-20",
    });
  });

  it("stops at the limits, not before", () => {
    expect(
      rules(
        day({
          rainMm: QC_LIMITS.rainDayMm,
          windMs: QC_LIMITS.windMs,
          tmaxC: QC_LIMITS.tmaxC,
          tminC: QC_LIMITS.tmaxC - QC_LIMITS.diurnalRangeC,
        }),
      ),
    ).toEqual([]);
  });
});

describe("solar radiation above the clear-sky envelope", () => {
  // FAO-56 Example 18 (Uccle, 50°48'N, 100 m, 6 July = day 187): Rso = 30.90 MJ m⁻² d⁻¹.
  const uccle = (solarMJm2: number) =>
    day({ date: "2026-07-06", latitude: 50.8, elevationM: 100, tmaxC: 21.5, tminC: 12.3, solarMJm2 });

  it("accepts measured solar up to the sensor tolerance above Rso", () => {
    expect(rules(uccle(22.07))).toEqual([]); // the example's own Rs
    expect(rules(uccle(32.0))).toEqual([]); // within 5 % of 30.90
  });

  it("flags solar beyond it, naming Rso", () => {
    const [flag] = weatherDayFlags(uccle(33.0));
    expect(flag?.rule).toBe("solar_clear_sky");
    expect(flag?.message).toContain("30.9 MJ/m²");
  });

  it("cannot judge without a latitude", () => {
    expect(rules(day({ solarMJm2: 45, latitude: null }))).toEqual([]);
  });
});

describe("gauges against their neighbours (common practice, no source)", () => {
  const g = (gaugeId: string, depthMm: number, location: GaugeDay["location"] = null): GaugeDay => ({
    gaugeId,
    date: "2026-11-20",
    depthMm,
    location,
    entity: "rain_reading",
    entityIds: [`r-${gaugeId}`],
  });

  it("flags a gauge far below the local median, and only that gauge", () => {
    const flags = neighbourFlags([g("A", 20), g("B", 22), g("C", 18), g("D", 5)]);
    expect(flags.map((f) => [f.entityId, f.rule])).toEqual([["r-D", "neighbour_ratio"]]);
    expect(flags[0]?.message).toContain("0.26 ×"); // 5 / median(20, 22, 18, 5) = 5 / 19
  });

  it("flags a dry gauge when its neighbours were wet", () => {
    // median(12, 9, 0) = 9: the dry gauge is flagged, the two wet ones are not dragged down by it
    expect(neighbourFlags([g("A", 12), g("B", 9), g("C", 0)]).map((f) => [f.entityId, f.rule])).toEqual([
      ["r-C", "zero_when_neighbours_wet"],
    ]);
  });

  it("says nothing on a light day, with one neighbour only, or about gauges too far away", () => {
    expect(neighbourFlags([g("A", 3), g("B", 4), g("C", 0)])).toEqual([]);
    expect(neighbourFlags([g("A", 20), g("B", 2)])).toEqual([]);
    const here = { latitudeDeg: -34.4, longitudeDeg: 146 };
    const far = { latitudeDeg: -35.4, longitudeDeg: 146 }; // about 111 km south
    expect(neighbourFlags([g("A", 20, far), g("B", 22, far), g("C", 0, here)])).toEqual([]);
  });
});

describe("tipping-bucket tips", () => {
  const tip = (id: string, s: number, depthMm = 0.2): TipQc => ({
    id,
    date: "2026-11-20",
    atMs: Date.UTC(2026, 10, 20, 4) + s * 1000,
    depthMm,
    resolutionMm: 0.2,
  });

  it("flags a tip closer than a bucket can tip twice (switch bounce; REFERENCES facts of practice)", () => {
    const flags = tipFlags([tip("a", 0), tip("b", 30), tip("c", 30.4), tip("d", 75)]);
    expect(flags.map((f) => [f.entityId, f.rule])).toEqual([["c", "double_tip"]]);
  });

  it("flags two tips stamped alike and stored as one record", () => {
    expect(tipFlags([tip("a", 0), tip("b", 60, 0.4)]).map((f) => f.rule)).toEqual(["double_tip"]);
  });

  it("flags a burst: more than 6 mm within a minute from a 0.2 mm bucket", () => {
    // a tip every 2 s (no double tips) puts 31 tips, 6.2 mm, into the minute from the first
    const burst = Array.from({ length: 40 }, (_, i) => tip(`t${i}`, i * 2));
    const flags = tipFlags(burst);
    expect(new Set(flags.map((f) => f.rule))).toEqual(new Set(["tip_burst"]));
    expect(flags).toHaveLength(40);
  });

  it("flags the seed's switch bounce: a second tip 1 s after the first", () => {
    expect(tipFlags([tip("a", 0), tip("b", 1)]).map((f) => [f.entityId, f.rule])).toEqual([
      ["b", "double_tip"],
    ]);
  });

  it("leaves steady rain alone: a tip every 30 s is 24 mm/h", () => {
    expect(tipFlags(Array.from({ length: 120 }, (_, i) => tip(`s${i}`, i * 30)))).toEqual([]);
  });
});
