"use client";

import "./statement-print.css";
import { useState, type ReactNode } from "react";
import { SelectField } from "@/components/forms/select-field";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { sendJson } from "@/lib/client/fetcher";
import { statementQuery, useStatement, type StatementChoice } from "@/lib/client/use-statement";
import { useUnits } from "@/lib/client/use-units";
import { ALLOCATION_WORDS, STATEMENT_CAUTION, formatNumber, formatShare, periodSpan, periodTitle } from "@/lib/statement/format";
import { monthLabel } from "@/lib/statement/period";
import { TERMS, TERM_LABELS, type Quantity } from "@/lib/statement/totals";
import type { Statement } from "@/lib/statement/types";
import { depthUnit, depthValue, formatLocalDate, type UnitSystem } from "@/lib/units";
import { AllocationChart } from "./allocation-chart";
import { YieldCell } from "./yield-cell";

function depth(mm: number, units: UnitSystem): string {
  return formatNumber(depthValue(mm, units), units === "imperial" ? 2 : 1);
}

function QuantityCells({ q, units }: { q: Quantity; units: UnitSystem }) {
  return (
    <>
      <td className="px-2 py-1.5 text-right">{depth(q.depthMm, units)}</td>
      <td className="px-2 py-1.5 text-right">{formatNumber(q.volumeM3, 0)}</td>
      <td className="px-2 py-1.5 text-right">{formatNumber(q.volumeMl, 2)}</td>
      <td className="px-2 py-1.5 text-right">{formatNumber(q.volumeAcreFt, 2)}</td>
    </>
  );
}

/** A table that scrolls sideways on a phone, by finger or keyboard. */
function Scroll({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-2xl bg-white ring-1 ring-river-100" tabIndex={0} role="region" aria-label={`${label}, scrolls sideways`}>
      {children}
    </div>
  );
}

function TotalsTable({ s, units }: { s: Statement; units: UnitSystem }) {
  const unit = depthUnit(units);
  return (
    <Scroll label="Totals">
      <table className="w-full min-w-[34rem] text-left text-sm tabular-nums">
        <caption className="sr-only">Totals of the statement in depth and volume</caption>
        <thead className="border-b border-river-100 text-ink/80">
          <tr>
            <th scope="col" className="px-2 py-2">
              Term
            </th>
            <th scope="col" className="px-2 py-2 text-right">
              {unit}
            </th>
            <th scope="col" className="px-2 py-2 text-right">
              m³
            </th>
            <th scope="col" className="px-2 py-2 text-right">
              ML
            </th>
            <th scope="col" className="px-2 py-2 text-right">
              acre-feet
            </th>
          </tr>
        </thead>
        <tbody>
          {TERMS.map((t) => (
            <tr key={t} data-term={t} className={`border-b border-river-50 ${t === "irrigationGross" || t === "etActual" ? "font-bold" : ""}`}>
              <th scope="row" className="px-2 py-1.5 font-normal">
                {TERM_LABELS[t]}
              </th>
              <QuantityCells q={s.totals.lines[t]} units={units} />
            </tr>
          ))}
          <tr data-term="closure" className="bg-river-50">
            <th scope="row" className="px-2 py-1.5">
              Balance closure
            </th>
            <QuantityCells q={s.totals.closure} units={units} />
          </tr>
        </tbody>
      </table>
    </Scroll>
  );
}

function AllocationSection({ s }: { s: Statement }) {
  const a = s.allocation;
  const warn = a.level === "approaching" || a.level === "reached";
  return (
    <section aria-labelledby="allocation" className="flex flex-col gap-3">
      <h2 id="allocation" className="text-lg font-bold">
        Allocation, water year {a.label}
      </h2>
      <p className="text-sm text-ink/80">
        Gross irrigation of the whole farm from {periodSpan(a)}, against the allocation and carryover.
      </p>
      <dl className="grid grid-cols-2 gap-2 text-sm sm:grid-cols-4">
        {[
          ["Allocation", a.allocationMl === null ? "not set" : `${formatNumber(a.allocationMl, 1)} ML`],
          ["Carryover", `${formatNumber(a.carryoverMl, 1)} ML`],
          ["Used", `${formatNumber(a.usedMl, 2)} ML`],
          ["Of the limit", formatShare(a.shareUsed)],
        ].map(([k, v]) => (
          <div key={k} className="rounded-xl bg-white p-2 ring-1 ring-river-100">
            <dt className="text-ink/75">{k}</dt>
            <dd className="text-lg font-bold tabular-nums">{v}</dd>
          </div>
        ))}
      </dl>
      {warn ? <Notice tone="problem">{ALLOCATION_WORDS[a.level]}</Notice> : <Notice>{ALLOCATION_WORDS[a.level]}</Notice>}
      <div className="rb-no-print">
        <AllocationChart months={a.months} limitMl={a.limitMl} />
      </div>
      <Scroll label="Allocation use by month">
        <table className="w-full min-w-[24rem] text-left text-sm tabular-nums">
          <thead className="border-b border-river-100 text-ink/80">
            <tr>
              <th scope="col" className="px-2 py-2">
                Month
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                Used, ML
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                So far, ML
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                Of the limit
              </th>
            </tr>
          </thead>
          <tbody>
            {a.months.map((m) => (
              <tr key={m.month} className="border-b border-river-50">
                <th scope="row" className="px-2 py-1.5 font-normal">
                  {monthLabel(m.month)}
                </th>
                <td className="px-2 py-1.5 text-right">{m.useM3 === null ? "—" : formatNumber(m.useM3 / 1000, 2)}</td>
                <td className="px-2 py-1.5 text-right">{formatNumber(m.cumulativeMl, 2)}</td>
                <td className={`px-2 py-1.5 text-right ${m.shareOfLimit !== null && m.shareOfLimit >= 0.8 ? "font-bold text-clay-700" : ""}`}>
                  {formatShare(m.shareOfLimit)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Scroll>
    </section>
  );
}

function FieldsSection({ s, units }: { s: Statement; units: UnitSystem }) {
  if (s.field || s.fields.length === 0) return null;
  const unit = depthUnit(units);
  const cols = [
    ["rain", "Rain"],
    ["effectiveRain", "Effective rain"],
    ["irrigationGross", "Irrigation gross"],
    ["irrigationNet", "Irrigation net"],
    ["etActual", "Crop ET"],
    ["deepPercolation", "Deep percolation"],
  ] as const;
  return (
    <section aria-labelledby="by-field" className="flex flex-col gap-2">
      <h2 id="by-field" className="text-lg font-bold">
        By field ({unit})
      </h2>
      <Scroll label="By field">
        <table className="w-full min-w-[40rem] text-left text-sm tabular-nums">
          <thead className="border-b border-river-100 text-ink/80">
            <tr>
              <th scope="col" className="px-2 py-2">
                Field
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                ha
              </th>
              {cols.map(([k, label]) => (
                <th key={k} scope="col" className="px-2 py-2 text-right">
                  {label}
                </th>
              ))}
              <th scope="col" className="px-2 py-2 text-right">
                Gross m³
              </th>
            </tr>
          </thead>
          <tbody>
            {s.fields.map((f) => (
              <tr key={f.fieldId} className="border-b border-river-50">
                <th scope="row" className="px-2 py-1.5 font-normal">
                  {f.name}
                </th>
                <td className="px-2 py-1.5 text-right">{formatNumber(f.fieldAreaHa, 1)}</td>
                {cols.map(([k]) => (
                  <td key={k} className="px-2 py-1.5 text-right">
                    {f.fieldDays > 0 ? depth(f.lines[k].depthMm, units) : "—"}
                  </td>
                ))}
                <td className="px-2 py-1.5 text-right">{formatNumber(f.lines.irrigationGross.volumeM3, 0)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Scroll>
    </section>
  );
}

function ProductivitySection({ s, farmId, canEditYield, reload }: { s: Statement; farmId: string; canEditYield: boolean; reload: () => Promise<unknown> }) {
  const rows = s.productivity;
  return (
    <section aria-labelledby="productivity" className="flex flex-col gap-2">
      <h2 id="productivity" className="text-lg font-bold">
        Water productivity
      </h2>
      {rows.length === 0 ? (
        <p className="text-sm text-ink/80">No planting has account days in this statement.</p>
      ) : (
        <Scroll label="Water productivity">
          <table className="w-full min-w-[36rem] text-left text-sm tabular-nums">
            <thead className="border-b border-river-100 text-ink/80">
              <tr>
                <th scope="col" className="px-2 py-2">
                  Field
                </th>
                <th scope="col" className="px-2 py-2">
                  Crop, season
                </th>
                <th scope="col" className="px-2 py-2 text-right">
                  Yield, t/ha
                </th>
                <th scope="col" className="px-2 py-2 text-right">
                  kg per m³ irrigation
                </th>
                <th scope="col" className="px-2 py-2 text-right">
                  kg per m³ crop ET
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((p) => (
                <tr key={p.plantingId} className="border-b border-river-50">
                  <th scope="row" className="px-2 py-1.5 font-normal">
                    {p.fieldName}
                  </th>
                  <td className="px-2 py-1.5">
                    {p.cropName}, {p.season}
                  </td>
                  <td className="px-2 py-1.5 text-right">
                    <YieldCell
                      farmId={farmId}
                      plantingId={p.plantingId}
                      label={`${p.fieldName}, ${p.cropName} ${p.season}`}
                      yieldTHa={p.yieldTHa}
                      canEdit={canEditYield}
                      onSaved={reload}
                    />
                  </td>
                  <td className="px-2 py-1.5 text-right">{formatNumber(p.kgPerM3Irrigation, 2)}</td>
                  <td className="px-2 py-1.5 text-right">{formatNumber(p.kgPerM3Et, 2)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </Scroll>
      )}
      <p className="text-xs text-ink/75">
        Yield is in tonnes per hectare as harvested{canEditYield ? "; enter it here once the crop is off" : ", entered by the farm's managers and agronomists"}.
      </p>
    </section>
  );
}

function choiceValue(c: StatementChoice, s: Statement | undefined): string {
  if (c.season !== undefined) return `season:${c.season}`;
  if (c.waterYear !== undefined) return `year:${c.waterYear}`;
  return s?.period.kind === "water-year" ? `year:${s.period.year}` : "";
}

/** The season water statement: choose field and period, read the totals, allocation and productivity, download, print or send. */
export function StatementView({
  farmId,
  initialUnits,
  initialChoice = {},
  canEditYield = false,
}: {
  farmId: string;
  initialUnits: UnitSystem;
  initialChoice?: StatementChoice;
  /** whether this person may edit plantings (and so enter yields) */
  canEditYield?: boolean;
}) {
  const { units } = useUnits(initialUnits);
  const [choice, setChoiceState] = useState<StatementChoice>(initialChoice);
  // The address follows the choice, so a link or a reload opens the same statement.
  const setChoice = (next: (c: StatementChoice) => StatementChoice) => {
    const c = next(choice);
    setChoiceState(c);
    window.history.replaceState(null, "", `${window.location.pathname}${statementQuery(c)}`);
  };
  const [sending, setSending] = useState(false);
  const [sent, setSent] = useState<{ ok: boolean; text: string } | null>(null);
  const { data: s, error, isLoading, mutate } = useStatement(farmId, choice);

  if (error && !s) return <Notice tone="problem">Could not make the statement: {error.message}</Notice>;
  if (!s) return <p className="text-ink/75">Adding up the season…</p>;

  const base = `/api/v1/farms/${farmId}/statement`;
  const query = statementQuery(choice);
  const periodOptions = [
    ...s.choices.waterYears.map((y) => ({ value: `year:${y.year}`, label: `Water year ${y.label}` })),
    ...s.choices.seasons.map((x) => ({ value: `season:${x.season}`, label: `Crop season ${x.season}` })),
  ];
  const fieldOptions = [{ value: "", label: "Whole farm" }, ...s.choices.fields.map((f) => ({ value: f.id, label: `${f.name}${f.archived ? " (archived)" : ""}` }))];

  const choosePeriod = (v: string) => {
    setSent(null);
    setChoice((c) => (v.startsWith("season:") ? { fieldId: c.fieldId, season: v.slice(7) } : { fieldId: c.fieldId, waterYear: Number(v.slice(5)) }));
  };
  const chooseField = (v: string) => {
    setSent(null);
    setChoice((c) => ({ ...c, fieldId: v || undefined }));
  };
  const send = async () => {
    setSending(true);
    setSent(null);
    try {
      const res = await sendJson<{ to: string }>(`${base}/send`, "POST", { ...choice });
      setSent({ ok: true, text: `The statement is on its way to ${res.to} as a PDF.` });
    } catch (err) {
      setSent({ ok: false, text: err instanceof Error ? err.message : "Could not send the statement." });
    } finally {
      setSending(false);
    }
  };

  const closure = s.totals.closure.depthMm;
  return (
    <div className="rb-statement flex flex-col gap-5" aria-busy={isLoading}>
      <div>
        <h1 className="text-2xl font-bold">Season water statement</h1>
        <p className="text-ink/80">
          {s.farm.name}: {s.field ? s.field.name : "whole farm"}. {periodTitle(s.period)}, {periodSpan(s.period)}.
        </p>
        <p className="text-sm text-ink/75">
          {formatNumber(s.totals.areaHa, 1)} ha, {s.totals.fieldDays} field-days of the water account
          {s.totals.lastDate ? `, up to ${formatLocalDate(s.totals.lastDate, "long")}` : ""}. Made on {s.madeOn}.
        </p>
      </div>

      <div className="rb-no-print grid gap-3 sm:grid-cols-2">
        <SelectField id="statement-period" label="Period" options={periodOptions} value={choiceValue(choice, s)} onChange={(e) => choosePeriod(e.target.value)} />
        <SelectField id="statement-field" label="Field" options={fieldOptions} value={choice.fieldId ?? ""} onChange={(e) => chooseField(e.target.value)} />
      </div>
      <div className="rb-no-print flex flex-wrap gap-2">
        <a className="tap inline-flex items-center rounded-xl bg-white px-4 py-2 font-bold text-river-900 ring-1 ring-river-300 hover:bg-river-50" href={`${base}.csv${query}`} download>
          Download CSV
        </a>
        <a className="tap inline-flex items-center rounded-xl bg-white px-4 py-2 font-bold text-river-900 ring-1 ring-river-300 hover:bg-river-50" href={`${base}.pdf${query}`} download>
          Download PDF
        </a>
        <Button variant="secondary" type="button" onClick={() => window.print()}>
          Print
        </Button>
        <Button type="button" onClick={() => void send()} disabled={sending}>
          {sending ? "Sending…" : "Send to me by e-mail"}
        </Button>
      </div>
      {sent && <Notice tone={sent.ok ? "success" : "problem"}>{sent.text}</Notice>}

      <p className="rounded-xl bg-clay-50 px-4 py-3 text-sm text-clay-900 ring-1 ring-clay-300">
        <span className="font-bold">Estimates, not a meter reading. </span>
        {STATEMENT_CAUTION}
      </p>

      <section aria-labelledby="totals" className="flex flex-col gap-2">
        <h2 id="totals" className="text-lg font-bold">
          Totals
        </h2>
        {s.totals.fieldDays === 0 ? (
          <Notice>The water account has no days in this period yet.</Notice>
        ) : (
          <>
            <TotalsTable s={s} units={units} />
            <p className="text-sm" data-testid="closure">
              <span className="font-bold">
                The books close to {depth(closure, units)} {depthUnit(units)}
              </span>{" "}
              (effective rain + net irrigation + capillary rise − crop ET − deep percolation − storage change). 1 ML = 1,000 m³; 1 acre-foot =
              1,233.48 m³.
            </p>
          </>
        )}
      </section>

      <AllocationSection s={s} />
      <FieldsSection s={s} units={units} />
      <ProductivitySection s={s} farmId={farmId} canEditYield={canEditYield} reload={() => mutate()} />
    </div>
  );
}
