"use client";

import "./plan-print.css";
import Link from "next/link";
import { useMemo } from "react";
import { EstimateCaution } from "@/components/field/estimate-caution";
import { UnitSwitch } from "@/components/map/unit-switch";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { useFields } from "@/lib/client/use-fields";
import { usePlan } from "@/lib/client/use-plan";
import { useSystems } from "@/lib/client/use-systems";
import { useUnits } from "@/lib/client/use-units";
import { addDaysLocal } from "./dates";
import { formatDepth, formatLocalDate, formatVolume, type UnitSystem } from "@/lib/units";
import { planCsv, planRows } from "./plan-csv";
import { WaterOrder } from "./water-order";

export const PLAN_DAYS = 7;

function download(name: string, text: string) {
  const url = URL.createObjectURL(new Blob([text], { type: "text/csv;charset=utf-8" }));
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The farm plan: which field when over the next days, within pump and system capacity, and where capacity falls short. */
export function FarmPlan({ farmId, farmName, initialUnits }: { farmId: string; farmName: string; initialUnits: UnitSystem }) {
  const { units } = useUnits(initialUnits);
  const plan = usePlan(farmId, PLAN_DAYS);
  const fields = useFields(farmId);
  const systems = useSystems(farmId);
  const fieldMap = useMemo(() => new Map((fields.data ?? []).map((f) => [f.id, { name: f.name, systemId: f.irrigationSystemId }])), [fields.data]);
  const systemMap = useMemo(() => new Map((systems.data?.data ?? []).map((s) => [s.id, s])), [systems.data]);
  const rows = useMemo(() => (plan.data ? planRows(plan.data, fieldMap, systemMap) : []), [plan.data, fieldMap, systemMap]);

  if (plan.error) return <Notice tone="problem">Could not make the plan: {plan.error.message}</Notice>;
  if (!plan.data || !fields.data || !systems.data) return <p className="text-ink/75">Working out the plan…</p>;
  const p = plan.data;
  const days = Array.from({ length: p.days }, (_, d) => addDaysLocal(p.startDate, d));
  const shortBy = new Map(p.shortfallDays.map((s) => [s.date, s]));
  const nameOf = (id: string) => fieldMap.get(id)?.name ?? "unknown field";

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-end justify-between gap-3 print:hidden">
        <div>
          <h1 className="text-2xl font-bold">Farm plan</h1>
          <p className="text-sm text-ink/80">
            The next {p.days} days from {formatLocalDate(p.startDate, "long")}, most urgent first within pump and system capacity.
          </p>
        </div>
        <UnitSwitch initial={initialUnits} />
      </div>
      <div className="print:hidden">
        <EstimateCaution />
      </div>
      {p.shortfallDays.length > 0 && (
        <div className="print:hidden">
          <Notice tone="problem">
            Capacity falls short on {p.shortfallDays.map((s) => formatLocalDate(s.date)).join(", ")}: some fields finish after they are due.
          </Notice>
        </div>
      )}
      <section aria-labelledby="by-day" className="print:hidden">
        <h2 id="by-day" className="mb-2 text-lg font-bold">
          Day by day
        </h2>
        <ol className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          {days.map((date) => {
            const today = p.irrigations.flatMap((i) => i.allocations.filter((a) => a.date === date && a.volumeM3 > 0).map((a) => ({ i, a })));
            const short = shortBy.get(date);
            return (
              <li key={date} className={`flex flex-col gap-1 rounded-2xl bg-white p-3 ring-1 ${short ? "ring-2 ring-clay-500" : "ring-river-100"}`}>
                <p className="font-bold">{formatLocalDate(date)}</p>
                {today.length === 0 ? (
                  <p className="text-sm text-ink/75">No irrigation</p>
                ) : (
                  <ul className="text-sm">
                    {today.map(({ i, a }) => (
                      <li key={i.fieldId}>
                        <Link href={`/farms/${farmId}/fields/${i.fieldId}`} className="font-bold text-river-700 underline">
                          {nameOf(i.fieldId)}
                        </Link>{" "}
                        {formatVolume(a.volumeM3, units)}
                      </li>
                    ))}
                  </ul>
                )}
                {short && (
                  <p className="text-sm font-bold text-clay-700">
                    Short: {formatVolume(short.backlogM3, units)} overdue ({short.fieldIds.map(nameOf).join(", ")})
                  </p>
                )}
              </li>
            );
          })}
        </ol>
      </section>
      <section aria-labelledby="irrigations" className="flex flex-col gap-2 print:hidden">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 id="irrigations" className="text-lg font-bold">
            Irrigations
          </h2>
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => download(`rootbank-plan-${p.startDate}.csv`, planCsv(rows))}>
              Download CSV
            </Button>
            <Button variant="secondary" onClick={() => window.print()}>
              Print water order
            </Button>
          </div>
        </div>
        {rows.length === 0 ? (
          <p className="text-ink/80">No field reaches its trigger in the next {p.days} days.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {rows.map((r) => (
              <li key={r.fieldId} className="rounded-2xl bg-white px-4 py-3 ring-1 ring-river-100">
                <p className="flex flex-wrap items-baseline justify-between gap-2">
                  <Link href={`/farms/${farmId}/fields/${r.fieldId}`} className="text-lg font-bold text-river-700 underline">
                    {r.field}
                  </Link>
                  <span className="text-sm">due {formatLocalDate(r.dueDate)}</span>
                </p>
                <p className="text-sm text-ink/85">
                  {r.startDate ? `${formatLocalDate(r.startDate)} to ${formatLocalDate(r.endDate ?? r.startDate)}` : "no capacity in these days"} · gross{" "}
                  {formatDepth(r.grossDepthMm, units, 1)} · {formatVolume(r.volumeM3, units)}
                  {r.system ? ` · ${r.system}` : ""}
                  {r.lateDays > 0 && <span className="font-bold text-clay-700"> · {r.lateDays === 1 ? "1 day" : `${r.lateDays} days`} late</span>}
                  {r.unplacedM3 > 0 && <span className="font-bold text-clay-700"> · {formatVolume(r.unplacedM3, units)} not placed</span>}
                </p>
              </li>
            ))}
          </ul>
        )}
        {p.notDue.length > 0 && <p className="text-sm text-ink/80">Not due in these days: {p.notDue.map(nameOf).join(", ")}.</p>}
      </section>
      <WaterOrder farmName={farmName} startDate={p.startDate} rows={rows} units={units} />
    </div>
  );
}
