import "server-only";
import PDFDocument from "pdfkit";
import { ALLOCATION_WORDS, STATEMENT_CAUTION, formatNumber, formatShare, periodSpan, periodTitle } from "./format";
import { monthLabel } from "./period";
import { TERMS, TERM_LABELS } from "./totals";
import type { Statement } from "./types";

// pdfkit's built-in Helvetica (Adobe's standard 14 fonts, metrics shipped with pdfkit): nothing to fetch or embed.
const REGULAR = "Helvetica";
const BOLD = "Helvetica-Bold";
const INK = "#17261f";
const MUTED = "#4d5a53";
const RULE = "#c9d6d2";
const WARN = "#7e3f1f";

type Doc = InstanceType<typeof PDFDocument>;

interface Column {
  title: string;
  width: number;
  align?: "left" | "right";
}

/** A plain table: a bold header, a rule, then rows; starts a new page when the next row would not fit. */
function table(doc: Doc, columns: Column[], rows: string[][], opts: { boldLast?: boolean } = {}): void {
  const left = doc.page.margins.left;
  const lineH = 14;
  const drawRow = (cells: string[], font: string) => {
    if (doc.y + lineH > doc.page.height - doc.page.margins.bottom) doc.addPage();
    const y = doc.y;
    let x = left;
    doc.font(font).fontSize(9).fillColor(INK);
    cells.forEach((c, i) => {
      const col = columns[i]!;
      doc.text(c, x + 2, y, { width: col.width - 4, align: col.align ?? "left", lineBreak: false });
      x += col.width;
    });
    doc.x = left;
    doc.y = y + lineH;
  };
  drawRow(
    columns.map((c) => c.title),
    BOLD,
  );
  const total = columns.reduce((s, c) => s + c.width, 0);
  doc.moveTo(left, doc.y - 3).lineTo(left + total, doc.y - 3).lineWidth(0.5).strokeColor(RULE).stroke();
  rows.forEach((r, i) => drawRow(r, opts.boldLast && i === rows.length - 1 ? BOLD : REGULAR));
  doc.moveDown(0.6);
}

function heading(doc: Doc, text: string): void {
  if (doc.y + 60 > doc.page.height - doc.page.margins.bottom) doc.addPage();
  doc.moveDown(0.4).font(BOLD).fontSize(12).fillColor(INK).text(text, doc.page.margins.left);
  doc.moveDown(0.3);
}

function paragraph(doc: Doc, text: string, color = MUTED): void {
  doc.font(REGULAR).fontSize(9).fillColor(color).text(text, doc.page.margins.left, doc.y, { width: doc.page.width - doc.page.margins.left - doc.page.margins.right });
  doc.moveDown(0.4);
}

/** The statement as an A4 PDF. */
export function statementPdf(s: Statement): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    margins: { top: 48, bottom: 48, left: 48, right: 48 },
    info: { Title: `Season water statement: ${s.farm.name}, ${periodTitle(s.period)}`, Author: "Rootbank", Creator: "Rootbank" },
  });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  doc.font(BOLD).fontSize(18).fillColor(INK).text("Season water statement");
  doc.font(REGULAR).fontSize(11).text(`${s.farm.name}: ${s.field ? s.field.name : "whole farm"}`);
  doc.fontSize(10).fillColor(MUTED).text(`${periodTitle(s.period)}, ${periodSpan(s.period)}. Made on ${s.madeOn}.`);
  doc.text(
    `Area ${formatNumber(s.totals.areaHa, 1)} ha over ${s.totals.fieldDays} field-days of the water account` +
      (s.totals.lastDate ? `, up to ${s.totals.lastDate}.` : "; no account day yet."),
  );
  doc.moveDown(0.6);
  paragraph(doc, STATEMENT_CAUTION, WARN);

  heading(doc, "Totals");
  const qty = [
    { title: "mm", width: 70, align: "right" as const },
    { title: "m³", width: 80, align: "right" as const },
    { title: "ML", width: 70, align: "right" as const },
    { title: "acre-feet", width: 70, align: "right" as const },
  ];
  table(
    doc,
    [{ title: "", width: 209 }, ...qty],
    [
      ...TERMS.map((t) => {
        const q = s.totals.lines[t];
        return [TERM_LABELS[t], formatNumber(q.depthMm, 1), formatNumber(q.volumeM3, 0), formatNumber(q.volumeMl, 2), formatNumber(q.volumeAcreFt, 2)];
      }),
      ["Balance closure", formatNumber(s.totals.closure.depthMm, 1), formatNumber(s.totals.closure.volumeM3, 0), formatNumber(s.totals.closure.volumeMl, 2), formatNumber(s.totals.closure.volumeAcreFt, 2)],
    ],
    { boldLast: true },
  );
  paragraph(
    doc,
    `The balance closes to ${formatNumber(s.totals.closure.depthMm, 1)} mm: effective rain + net irrigation + capillary rise - crop ET - deep percolation - storage change. ` +
      "1 ML = 1,000 m³; 1 acre-foot = 1,233.48 m³; 1 mm over 1 ha = 10 m³.",
  );

  const a = s.allocation;
  heading(doc, `Allocation, water year ${a.label} (whole farm)`);
  paragraph(
    doc,
    `Allocation ${a.allocationMl === null ? "not set" : `${formatNumber(a.allocationMl, 1)} ML`}, carryover ${formatNumber(a.carryoverMl, 1)} ML, ` +
      `limit ${a.limitMl === null ? "none" : `${formatNumber(a.limitMl, 1)} ML`}. Used ${formatNumber(a.usedMl, 2)} ML (${formatShare(a.shareUsed)}).`,
    INK,
  );
  paragraph(doc, ALLOCATION_WORDS[a.level], a.level === "approaching" || a.level === "reached" ? WARN : MUTED);
  table(
    doc,
    [
      { title: "Month", width: 120 },
      { title: "Use, ML", width: 90, align: "right" },
      { title: "Cumulative, ML", width: 110, align: "right" },
      { title: "Of the limit", width: 90, align: "right" },
    ],
    a.months
      .filter((m) => m.useM3 !== null)
      .map((m) => [monthLabel(m.month), formatNumber((m.useM3 ?? 0) / 1000, 2), formatNumber(m.cumulativeMl, 2), formatShare(m.shareOfLimit)]),
  );

  if (!s.field && s.fields.length > 0) {
    heading(doc, "By field (mm)");
    table(
      doc,
      [
        { title: "Field", width: 114 },
        { title: "ha", width: 45, align: "right" },
        { title: "Rain", width: 55, align: "right" },
        { title: "Eff. rain", width: 55, align: "right" },
        { title: "Irr. gross", width: 60, align: "right" },
        { title: "Irr. net", width: 55, align: "right" },
        { title: "Crop ET", width: 55, align: "right" },
        { title: "Deep perc.", width: 60, align: "right" },
      ],
      s.fields.map((f) => [
        f.name,
        formatNumber(f.fieldAreaHa, 1),
        formatNumber(f.lines.rain.depthMm, 1),
        formatNumber(f.lines.effectiveRain.depthMm, 1),
        formatNumber(f.lines.irrigationGross.depthMm, 1),
        formatNumber(f.lines.irrigationNet.depthMm, 1),
        formatNumber(f.lines.etActual.depthMm, 1),
        formatNumber(f.lines.deepPercolation.depthMm, 1),
      ]),
    );
  }

  const withYield = s.productivity.filter((p) => p.yieldTHa !== null);
  heading(doc, "Water productivity");
  if (withYield.length === 0) paragraph(doc, "No yield is entered for the plantings in this statement.");
  else {
    table(
      doc,
      [
        { title: "Field", width: 110 },
        { title: "Crop, season", width: 119 },
        { title: "t/ha", width: 50, align: "right" },
        { title: "Irrigation m³", width: 80, align: "right" },
        { title: "kg/m³ irr.", width: 70, align: "right" },
        { title: "kg/m³ ET", width: 70, align: "right" },
      ],
      withYield.map((p) => [
        p.fieldName,
        `${p.cropName}, ${p.season}`,
        formatNumber(p.yieldTHa, 1),
        formatNumber(p.irrigationGrossM3, 0),
        formatNumber(p.kgPerM3Irrigation, 2),
        formatNumber(p.kgPerM3Et, 2),
      ]),
    );
  }
  doc.end();
  return done;
}
