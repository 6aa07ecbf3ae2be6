import { describe, expect, it } from "vitest";
import {
  computeOutlook,
  irrigationDepths,
  planFarm,
  planFieldFromOutlook,
  type OutlookInput,
} from "@/lib/waterbalance";
import { plainField } from "./helpers";

function outlookInput(overrides: Partial<OutlookInput> = {}): OutlookInput {
  const f = plainField();
  return {
    field: f.field,
    planting: f.planting,
    system: f.system,
    fromDate: "2026-11-11",
    startDepletionMm: 60,
    days: 10,
    recentEtoMm: [4, 5, 6],
    application: { kind: "flow", flowRateM3H: 250 },
    ...overrides,
  };
}

describe("outlook and recommendation", () => {
  it("finds the first day depletion reaches RAW and the depths to apply", () => {
    const o = computeOutlook(outlookInput());
    // recent mean ETo 5, Kc 1: 65, 70, 75 -> RAW 75 (p 0.5 × TAW 150) on the third day
    expect(o.meanEtoMm).toBe(5);
    expect(o.days.slice(0, 3).map((d) => d.depletionEndMm)).toEqual([65, 70, 75]);
    expect(o.triggerDate).toBe("2026-11-13");
    expect(o.daysUntilTrigger).toBe(2);
    expect(o.dueNow).toBe(false);
    expect(o.netDepthMm).toBe(75); // refill to field capacity
    expect(o.grossDepthMm).toBeCloseTo(93.75, 12); // 75 / 0.8
    expect(o.grossVolumeM3).toBeCloseTo(9375, 9); // 93.75 mm × 10 ha × 10 m³
    expect(o.runTimeH).toBeCloseTo(37.5, 9); // 9375 m³ / 250 m³/h
  });

  it("leaves a reserve for rain", () => {
    expect(computeOutlook(outlookInput({ reserveMm: 10 })).netDepthMm).toBe(65);
  });

  it("uses forecast ETo where given and the recent mean after it", () => {
    const o = computeOutlook(outlookInput({ forecastEtoMm: [8, 8], startDepletionMm: 40 }));
    expect(o.days.map((d) => d.etoSource).slice(0, 3)).toEqual(["forecast", "forecast", "recent-mean"]);
    expect(o.days[0]!.depletionEndMm).toBe(48);
    // at ETc 8, p = 0.38 and RAW 57 mm (FAO-56 Table 22 footnote): a start above it is stressed
    const stressed = computeOutlook(outlookInput({ forecastEtoMm: [8] }));
    expect(stressed.days[0]!.ks).toBeCloseTo(90 / 93, 12);
  });

  it("counts discounted forecast rain", () => {
    const o = computeOutlook(outlookInput({ forecastRainMm: [0, 20], forecastRainDiscount: 0.5 }));
    expect(o.days[1]!.rainCountedMm).toBe(10);
    // 65, 70 − 10 = 60, 65, 70, 75
    expect(o.triggerDate).toBe("2026-11-15");
  });

  it("uses a MAD trigger and reports a field already due", () => {
    const o = computeOutlook(outlookInput({ trigger: { mad: 0.4 } }));
    expect(o.dueNow).toBe(true); // 60 ≥ 0.4 × 150
    expect(o.triggerDate).toBe("2026-11-11");
    expect(o.netDepthMm).toBe(65);
  });

  it("returns no date when the trigger is not reached", () => {
    const o = computeOutlook(outlookInput({ startDepletionMm: 0, days: 3 }));
    expect(o.triggerDate).toBeNull();
    expect(o.grossDepthMm).toBeNull();
  });

  it("run time for a pivot from depth per pass", () => {
    const r = irrigationDepths(30, 0.8, 50, { kind: "pivot", depthPerPassMm: 12.5, hoursPerPass: 20 });
    expect(r.grossDepthMm).toBeCloseTo(37.5, 12);
    expect(r.pivotPasses).toBeCloseTo(3, 12);
    expect(r.runTimeH).toBeCloseTo(60, 12);
    expect(r.grossVolumeM3).toBeCloseTo(18750, 9);
  });

  it("carries the account's climate-adjusted Kc", () => {
    const o = computeOutlook(
      outlookInput({ kcUsed: { ini: 1.1, mid: 1.1, end: 1.1 }, startDepletionMm: 20 }),
    );
    expect(o.days[0]!.kc).toBeCloseTo(1.1, 12);
    expect(o.days[0]!.depletionEndMm).toBeCloseTo(25.5, 12);
  });

  it("needs some ETo to project with", () => {
    expect(() => computeOutlook(outlookInput({ recentEtoMm: [] }))).toThrow(/recentEtoMm/);
  });
});

describe("farm plan", () => {
  const fields = [
    { fieldId: "A", areaHa: 10, dueDate: "2026-11-11", grossDepthMm: 15, capacityGroupIds: ["pump"] },
    { fieldId: "B", areaHa: 8, dueDate: "2026-11-12", grossDepthMm: 10, capacityGroupIds: ["pump"] },
    { fieldId: "C", areaHa: 5, dueDate: "2026-11-16", grossDepthMm: 10, capacityGroupIds: ["pump"] },
    { fieldId: "D", areaHa: 5, dueDate: null, grossDepthMm: 0, capacityGroupIds: ["pump"] },
  ];

  it("orders by urgency and reports the days capacity cannot keep up", () => {
    const plan = planFarm({
      startDate: "2026-11-11",
      days: 7,
      fields,
      capacities: [{ id: "pump", m3PerDay: 1000 }],
      leadDays: 0,
    });
    expect(plan.notDue).toEqual(["D"]);
    expect(plan.irrigations.map((i) => [i.fieldId, i.rank, i.startDate, i.endDate, i.lateDays])).toEqual([
      ["A", 1, "2026-11-11", "2026-11-12", 1],
      ["B", 2, "2026-11-12", "2026-11-13", 1],
      ["C", 3, "2026-11-16", "2026-11-16", 0],
    ]);
    expect(plan.shortfallDays.map((s) => [s.date, s.backlogM3, s.fieldIds, s.saturatedGroupIds])).toEqual([
      ["2026-11-11", 500, ["A"], ["pump"]],
      ["2026-11-12", 300, ["B"], ["pump"]],
    ]);
  });

  it("starts early within the lead days", () => {
    const plan = planFarm({
      startDate: "2026-11-11",
      days: 7,
      fields,
      capacities: [{ id: "pump", mmPerDay: 10, areaHa: 10 }],
      leadDays: 2,
    });
    const c = plan.irrigations.find((i) => i.fieldId === "C");
    expect(c?.startDate).toBe("2026-11-14");
    expect(c?.lateDays).toBe(0);
  });

  it("an irrigation draws on every group it uses", () => {
    const plan = planFarm({
      startDate: "2026-11-11",
      days: 3,
      fields: [
        {
          fieldId: "P1",
          areaHa: 10,
          dueDate: "2026-11-11",
          grossDepthMm: 10,
          capacityGroupIds: ["pump", "pivot-1"],
        },
        { fieldId: "P2", areaHa: 10, dueDate: "2026-11-11", grossDepthMm: 10, capacityGroupIds: ["pump"] },
      ],
      capacities: [
        { id: "pump", m3PerDay: 1500 },
        { id: "pivot-1", m3PerDay: 600 },
      ],
    });
    const day1 = plan.groupUse.filter((g) => g.date === "2026-11-11");
    expect(day1.find((g) => g.groupId === "pivot-1")?.usedM3).toBe(600);
    expect(day1.find((g) => g.groupId === "pump")?.usedM3).toBe(1500);
  });

  it("builds plan entries from outlooks", () => {
    const f = plainField();
    const o = computeOutlook({
      field: f.field,
      planting: f.planting,
      system: f.system,
      fromDate: "2026-11-11",
      startDepletionMm: 60,
      days: 5,
      recentEtoMm: [5],
    });
    const p = planFieldFromOutlook("A", 10, o, ["pump"]);
    expect(p).toEqual({
      fieldId: "A",
      areaHa: 10,
      dueDate: "2026-11-13",
      grossDepthMm: 93.75,
      depletionFraction: 0.5,
      capacityGroupIds: ["pump"],
    });
  });
});
