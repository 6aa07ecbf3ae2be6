/**
 * The statement as CSV (RFC 4180) for a spreadsheet, a water authority or an auditor: one long table,
 * one value per row, with SI-style units in the column names. Pure.
 */
import Papa from "papaparse";
import { monthLabel } from "./period";
import { TERMS, TERM_LABELS, type Quantity, type Term } from "./totals";
import type { Statement } from "./types";

export const CSV_COLUMNS = ["section", "item", "label", "field", "month", "depth_mm", "volume_m3", "volume_ml", "volume_acre_ft", "value", "unit"] as const;
type CsvRow = Partial<Record<(typeof CSV_COLUMNS)[number], string | number>>;

/** camelCase term → snake_case item name. */
export function termItem(term: Term | "closure"): string {
  return term.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);
}

const round = (v: number, digits: number): number => {
  const f = 10 ** digits;
  const r = Math.round(v * f) / f;
  return Object.is(r, -0) ? 0 : r;
};

function quantityCells(q: Quantity): CsvRow {
  return { depth_mm: round(q.depthMm, 2), volume_m3: round(q.volumeM3, 1), volume_ml: round(q.volumeMl, 4), volume_acre_ft: round(q.volumeAcreFt, 4) };
}

function termRows(section: string, lines: Record<Term, Quantity>, extra: CsvRow): CsvRow[] {
  return TERMS.map((t) => ({ section, item: termItem(t), label: TERM_LABELS[t], ...extra, ...quantityCells(lines[t]) }));
}

/** The statement as CSV text, header first, CRLF line ends. */
export function statementCsv(s: Statement): string {
  const scope = s.field ? s.field.name : "whole farm";
  const period = s.period.kind === "water-year" ? `water year ${s.period.label}` : `crop season ${s.period.season}`;
  const rows: CsvRow[] = [
    { section: "statement", item: "farm", value: s.farm.name },
    { section: "statement", item: "scope", value: scope },
    { section: "statement", item: "period", value: period },
    { section: "statement", item: "from", value: s.period.from },
    { section: "statement", item: "to", value: s.period.to },
    { section: "statement", item: "made_on", value: s.madeOn },
    { section: "statement", item: "last_account_day", value: s.totals.lastDate ?? "" },
    { section: "statement", item: "area", value: round(s.totals.areaHa, 2), unit: "ha" },
    { section: "statement", item: "field_days", value: s.totals.fieldDays, unit: "days" },
    { section: "statement", item: "note", value: "estimates from the daily water account; confirm with meters and field checks" },
    ...termRows("totals", s.totals.lines, { field: scope }),
    { section: "totals", item: "closure", label: "Balance closure (in - out - storage change)", field: scope, ...quantityCells(s.totals.closure) },
  ];
  if (!s.field) {
    for (const f of s.fields) rows.push(...termRows("field", f.lines, { field: f.name }));
  }
  for (const m of s.months) {
    if (m.fieldDays > 0) rows.push(...termRows("month", m.lines, { field: scope, month: m.month }));
  }
  const a = s.allocation;
  rows.push(
    { section: "allocation", item: "water_year", value: a.label },
    { section: "allocation", item: "allocation", value: a.allocationMl ?? "", unit: "ML" },
    { section: "allocation", item: "carryover", value: a.carryoverMl, unit: "ML" },
    { section: "allocation", item: "limit", value: a.limitMl ?? "", unit: "ML" },
    { section: "allocation", item: "used", label: "Gross irrigation, whole farm", value: round(a.usedMl, 4), unit: "ML" },
    { section: "allocation", item: "share_used", value: a.shareUsed === null ? "" : round(a.shareUsed * 100, 1), unit: "%" },
    { section: "allocation", item: "level", value: a.level },
  );
  for (const m of a.months) {
    if (m.useM3 === null) continue;
    rows.push({
      section: "allocation",
      item: "month_use",
      label: monthLabel(m.month),
      month: m.month,
      volume_m3: round(m.useM3, 1),
      volume_ml: round(m.useM3 / 1000, 4),
      value: m.cumulativeMl === null ? "" : round(m.cumulativeMl, 4),
      unit: "ML cumulative",
    });
  }
  for (const p of s.productivity) {
    const base = { section: "productivity", field: p.fieldName, label: `${p.cropName}, ${p.season}` };
    rows.push(
      { ...base, item: "yield", value: p.yieldTHa ?? "", unit: "t/ha" },
      { ...base, item: "irrigation_gross", volume_m3: round(p.irrigationGrossM3, 1) },
      { ...base, item: "kg_per_m3_irrigation", value: p.kgPerM3Irrigation === null ? "" : round(p.kgPerM3Irrigation, 3), unit: "kg/m3" },
      { ...base, item: "kg_per_m3_et", value: p.kgPerM3Et === null ? "" : round(p.kgPerM3Et, 3), unit: "kg/m3" },
    );
  }
  return Papa.unparse({ fields: [...CSV_COLUMNS], data: rows.map((r) => CSV_COLUMNS.map((c) => r[c] ?? "")) }, { newline: "\r\n" }) + "\r\n";
}
