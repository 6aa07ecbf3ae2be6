// Expected values are hand arithmetic: great-circle distance on the 6371 km mean-radius sphere and
// inverse-distance-squared weights (Shepard 1968, from memory); the gauges are invented.
import { describe, expect, it } from "vitest";
import { distanceKm, rainFromGauges, type GaugeReading } from "@/lib/waterbalance";

const KM_LAT = 180 / (Math.PI * 6371); // degrees of latitude per km on a 6371 km sphere
const field = { latitudeDeg: -27.5, longitudeDeg: 151.9 };
const at = (kmNorth: number) => ({
  latitudeDeg: field.latitudeDeg + kmNorth * KM_LAT,
  longitudeDeg: field.longitudeDeg,
});

describe("rain for a field without its own gauge", () => {
  const gauges: GaugeReading[] = [
    { gaugeId: "north-1", ...at(1), rainMm: 10 },
    { gaugeId: "north-2", ...at(2), rainMm: 20 },
    { gaugeId: "far", ...at(30), rainMm: 80 },
    { gaugeId: "unread", ...at(0.5), rainMm: null },
  ];

  it("measures great-circle distance", () => {
    expect(distanceKm(field, at(1))).toBeCloseTo(1, 6);
  });

  it("inverse-distance weights within the radius and names the gauges and weights", () => {
    const r = rainFromGauges(field, gauges, { radiusKm: 10 });
    // 1/d²: weights 1 and 1/4 -> 0.8 and 0.2 (Shepard 1968); rain = 0.8 × 10 + 0.2 × 20 = 12 mm
    expect(r.method).toBe("idw");
    expect(r.rainMm).toBeCloseTo(12, 6);
    expect(r.gauges.map((g) => g.gaugeId)).toEqual(["north-1", "north-2"]);
    expect(r.gauges[0]!.weight).toBeCloseTo(0.8, 6);
    expect(r.gauges[1]!.weight).toBeCloseTo(0.2, 6);
  });

  it("takes the nearest gauge with a reading, never an unread one as zero", () => {
    const r = rainFromGauges(field, gauges, { method: "nearest" });
    expect(r.rainMm).toBe(10);
    expect(r.gauges).toEqual([{ gaugeId: "north-1", distanceKm: expect.closeTo(1, 6), weight: 1 }]);
  });

  it("returns null when nothing is within the radius", () => {
    expect(rainFromGauges(field, gauges, { radiusKm: 0.5 })).toEqual({
      rainMm: null,
      method: "idw",
      gauges: [],
    });
  });

  it("gives all the weight to a gauge on the field", () => {
    const r = rainFromGauges(field, [{ gaugeId: "here", ...field, rainMm: 7 }, ...gauges]);
    expect(r.rainMm).toBe(7);
    expect(r.gauges).toHaveLength(1);
  });
});
