/**
 * The season statement's pure parts: water-year spans, totals over fields of different areas, allocation
 * bands, water productivity and the CSV. Depths, areas and yields here are invented; each expected figure
 * is worked by hand beside it.
 */
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { allocationLevel, allocationUse } from "@/lib/statement/allocation";
import { statementCsv } from "@/lib/statement/csv";
import { formatNumber, formatShare, statementFileName } from "@/lib/statement/format";
import { monthsOf, waterYearLabel, waterYearOf, waterYearPeriod } from "@/lib/statement/period";
import { productivityOf } from "@/lib/statement/productivity";
import { quantityOf, totalsOf, type AccountSums } from "@/lib/statement/totals";
import type { Statement } from "@/lib/statement/types";

function sums(fieldId: string, month: string, over: Partial<AccountSums>): AccountSums {
  return {
    fieldId,
    plantingId: null,
    month,
    days: 30,
    lastDate: `${month}-30`,
    rainMm: 0,
    runoffMm: 0,
    effectiveRainMm: 0,
    irrigationGrossMm: 0,
    irrigationNetMm: 0,
    capillaryRiseMm: 0,
    etcMm: 0,
    etActualMm: 0,
    deepPercolationMm: 0,
    storageChangeMm: 0,
    ...over,
  };
}

describe("water years", () => {
  it("run from the 1st of the start month to the day before a year later", () => {
    // July start (the Rootbank default): 1 Jul 2026 to 30 Jun 2027, by the calendar.
    expect(waterYearPeriod(2026, 7)).toEqual({ from: "2026-07-01", to: "2027-06-30" });
    // January start is the calendar year.
    expect(waterYearPeriod(2026, 1)).toEqual({ from: "2026-01-01", to: "2026-12-31" });
    // March start ends on the last day of February; 2028 is a leap year (Gregorian rule).
    expect(waterYearPeriod(2027, 3).to).toBe("2028-02-29");
  });

  it("a date belongs to the water year that started on or before it", () => {
    expect(waterYearOf("2026-06-30", 7)).toBe(2025);
    expect(waterYearOf("2026-07-01", 7)).toBe(2026);
    expect(waterYearOf("2026-12-02", 1)).toBe(2026);
  });

  it("labels and months", () => {
    expect(waterYearLabel(2026, 7)).toBe("2026-27");
    expect(waterYearLabel(2099, 10)).toBe("2099-00");
    expect(waterYearLabel(2026, 1)).toBe("2026");
    const months = monthsOf(waterYearPeriod(2026, 7));
    expect(months).toHaveLength(12);
    expect(months[0]).toBe("2026-07");
    expect(months[11]).toBe("2027-06");
  });
});

describe("totals", () => {
  const areas = new Map([
    ["a", 40],
    ["b", 10],
  ]);

  it("add fields' volumes and give the depth over the fields that have days", () => {
    const t = totalsOf(
      [sums("a", "2026-07", { rainMm: 20, irrigationGrossMm: 30, irrigationNetMm: 25 }), sums("b", "2026-07", { rainMm: 10, irrigationGrossMm: 50, irrigationNetMm: 45 })],
      areas,
    );
    // 1 mm over 1 ha = 10 m³: rain 20 × 40 × 10 + 10 × 10 × 10 = 8,000 + 1,000 = 9,000 m³ over 50 ha = 18 mm.
    expect(t.lines.rain.volumeM3).toBeCloseTo(9000, 9);
    expect(t.lines.rain.depthMm).toBeCloseTo(18, 9);
    // gross 30 × 400 + 50 × 100 = 17,000 m³ = 17 ML (1 ML = 1,000 m³) = 13.78 acre-feet (1,233.48 m³ each).
    expect(t.lines.irrigationGross.volumeMl).toBeCloseTo(17, 9);
    expect(t.lines.irrigationGross.volumeAcreFt).toBeCloseTo(17000 / 1233.48, 9);
    // losses: gross − net = 5 × 400 + 5 × 100 = 2,500 m³
    expect(t.lines.applicationLoss.volumeM3).toBeCloseTo(2500, 9);
    expect(t.areaHa).toBe(50);
    expect(t.fieldDays).toBe(60);
  });

  it("closure is what the books leave unexplained", () => {
    // in: 10 + 20 + 0 = 30 mm; out: 25 + 3 = 28 mm; storage +2 mm: closes to 0.
    const closed = totalsOf([sums("a", "2026-07", { effectiveRainMm: 10, irrigationNetMm: 20, etActualMm: 25, deepPercolationMm: 3, storageChangeMm: 2 })], areas);
    expect(closed.closure.depthMm).toBeCloseTo(0, 12);
    // The same with storage +1 mm leaves 1 mm unexplained.
    const open = totalsOf([sums("a", "2026-07", { effectiveRainMm: 10, irrigationNetMm: 20, etActualMm: 25, deepPercolationMm: 3, storageChangeMm: 1 })], areas);
    expect(open.closure.depthMm).toBeCloseTo(1, 12);
    expect(open.closure.volumeM3).toBeCloseTo(400, 9);
  });

  it("a field without days adds no area", () => {
    const t = totalsOf([sums("a", "2026-07", { days: 0, rainMm: 0 })], areas);
    expect(t.areaHa).toBe(0);
    expect(quantityOf(0, 0).depthMm).toBe(0);
  });
});

describe("allocation", () => {
  it("bands from 80 % and 100 % (common practice, no source)", () => {
    expect(allocationLevel(null)).toBe("no-limit");
    expect(allocationLevel(0.79)).toBe("within");
    expect(allocationLevel(0.8)).toBe("approaching");
    expect(allocationLevel(1)).toBe("reached");
  });

  it("cumulative use by month against allocation + carryover, blank after the last day", () => {
    const months = ["2026-07", "2026-08", "2026-09", "2026-10"];
    const use = new Map([
      ["2026-07", 10_000],
      ["2026-09", 30_000],
    ]);
    const a = allocationUse(months, use, 40, 10);
    // limit 40 + 10 = 50 ML; used 10,000 + 30,000 m³ = 40 ML = 80 %.
    expect(a.limitMl).toBe(50);
    expect(a.usedMl).toBeCloseTo(40, 12);
    expect(a.shareUsed).toBeCloseTo(0.8, 12);
    expect(a.level).toBe("approaching");
    expect(a.months.map((m) => m.cumulativeMl)).toEqual([10, 10, 40, null]);
    expect(a.months[1]!.useM3).toBe(0);
    expect(a.months[2]!.shareOfLimit).toBeCloseTo(0.8, 12);
  });

  it("no allocation: use without a limit; a zero limit with use is past it", () => {
    expect(allocationUse(["2026-07"], new Map([["2026-07", 5000]]), null, 0).level).toBe("no-limit");
    expect(allocationUse(["2026-07"], new Map([["2026-07", 5000]]), 0, 0).level).toBe("reached");
    expect(formatShare(Infinity)).toBe("over the limit");
  });
});

describe("water productivity", () => {
  it("kg per m³ of irrigation and of crop ET", () => {
    // 12 t/ha × 1,000 kg/t × 20 ha = 240,000 kg; over 80,000 m³ irrigation = 3 kg/m³; over 120,000 m³ ET = 2 kg/m³.
    const p = productivityOf({ plantingId: "p", fieldId: "f", fieldName: "F", cropName: "Maize", season: "2026-27", areaHa: 20, yieldTHa: 12, irrigationGrossM3: 80_000, etActualM3: 120_000 });
    expect(p.yieldKg).toBe(240_000);
    expect(p.kgPerM3Irrigation).toBeCloseTo(3, 12);
    expect(p.kgPerM3Et).toBeCloseTo(2, 12);
    const none = productivityOf({ ...p, yieldTHa: null });
    expect(none.kgPerM3Irrigation).toBeNull();
    expect(productivityOf({ ...p, irrigationGrossM3: 0 }).kgPerM3Irrigation).toBeNull();
  });
});

describe("CSV and words", () => {
  it("parses back with the totals and closure", () => {
    const t = totalsOf([sums("a", "2026-07", { rainMm: 12.345, effectiveRainMm: 12.345, etActualMm: 10, storageChangeMm: 2.345 })], new Map([["a", 4]]));
    const s: Statement = {
      farm: { id: "farm", name: "Test, \"quoted\" farm", waterYearStartMonth: 7 },
      field: null,
      period: { kind: "water-year", year: 2026, label: "2026-27", from: "2026-07-01", to: "2027-06-30" },
      madeOn: "2026-12-02",
      totals: t,
      fields: [{ fieldId: "a", name: "North", fieldAreaHa: 4, ...t }],
      months: [{ month: "2026-07", fieldDays: 30, lines: t.lines }],
      allocation: { waterYear: 2026, label: "2026-27", from: "2026-07-01", to: "2027-06-30", ...allocationUse(["2026-07"], new Map([["2026-07", 0]]), 100, 0) },
      productivity: [],
      choices: { fields: [], waterYears: [], seasons: [] },
      estimate: true,
    };
    const parsed = Papa.parse<Record<string, string>>(statementCsv(s), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const rain = parsed.data.find((r) => r.section === "totals" && r.item === "rain")!;
    // 12.345 mm over 4 ha = 493.8 m³; the CSV keeps mm to 0.01.
    expect(Number(rain.depth_mm)).toBe(12.35);
    expect(Number(rain.volume_m3)).toBe(493.8);
    expect(parsed.data.find((r) => r.item === "farm")!.value).toBe('Test, "quoted" farm');
    expect(Number(parsed.data.find((r) => r.section === "totals" && r.item === "closure")!.depth_mm)).toBe(0);
  });

  it("numbers, shares and file names", () => {
    expect(formatNumber(1234.56, 1)).toBe("1,234.6");
    expect(formatNumber(-0.04, 1)).toBe("0.0");
    expect(formatShare(0.825)).toBe("83 %");
    expect(statementFileName("Kestrel Bend", { kind: "water-year", year: 2026, label: "2026-27", from: "", to: "" }, null, "pdf")).toBe(
      "rootbank-statement-kestrel-bend-2026-27.pdf",
    );
  });
});
