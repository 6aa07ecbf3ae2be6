"use client";

import { Area, Bar, CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { AccountDayDto } from "@/lib/client/use-field-account";
import type { OutlookDayDto } from "@/lib/client/use-field-outlook";
import { depthUnit, depthValue, formatLocalDate, type UnitSystem } from "@/lib/units";

interface Point {
  date: string;
  depletion?: number;
  outlook?: number;
  rawBand?: [number, number];
  tawBand?: [number, number];
  trigger?: number;
  rain?: number;
  effectiveRain?: number;
  irrigation?: number;
  etc?: number;
}

/** Past account days and outlook days as one series, in the person's units. */
export function chartPoints(past: readonly AccountDayDto[], future: readonly OutlookDayDto[], units: UnitSystem): Point[] {
  const v = (mm: number | null | undefined) => (mm === null || mm === undefined ? undefined : Math.round(depthValue(mm, units) * 100) / 100);
  let lastRaw: number | null = null;
  const out: Point[] = past.map((d) => {
    lastRaw = d.rawMm ?? lastRaw;
    return {
      date: d.date,
      depletion: v(d.depletionEndMm),
      rawBand: d.rawMm !== null ? [0, v(d.rawMm)!] : undefined,
      tawBand: d.rawMm !== null && d.tawMm !== null ? [v(d.rawMm)!, v(d.tawMm)!] : undefined,
      rain: v(d.rainMm),
      effectiveRain: v(d.effectiveRainMm),
      irrigation: v(d.irrigationNetMm),
      etc: v(d.etActualMm ?? d.etcMm),
    };
  });
  // The outlook line starts from the last stored day so the two read as one.
  const last = out[out.length - 1];
  if (last && future.length) last.outlook = last.depletion;
  for (const d of future) {
    // The outlook has no RAW of its own; RAW's share of TAW stays as the account last had it.
    const lastTaw = past[past.length - 1]?.tawMm ?? null;
    const rawMm = lastRaw !== null && lastTaw ? (lastRaw / lastTaw) * d.tawMm : null;
    out.push({
      date: d.date,
      outlook: v(d.depletionEndMm),
      rawBand: rawMm !== null ? [0, v(rawMm)!] : undefined,
      tawBand: rawMm !== null ? [v(rawMm)!, v(d.tawMm)!] : undefined,
      trigger: v(d.triggerMm),
      effectiveRain: v(d.effectiveRainMm) || undefined,
      etc: v(d.etcAdjMm),
    });
  }
  return out;
}

/**
 * The field's water account over recent weeks and the outlook: depletion (down is drier) against the
 * RAW and TAW bands, daily rain, effective rain and irrigation as bars, and crop ET.
 */
export function AccountChart({ past, future, today, units }: { past: readonly AccountDayDto[]; future: readonly OutlookDayDto[]; today: string; units: UnitSystem }) {
  const data = chartPoints(past, future, units);
  const unit = depthUnit(units);
  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="text-sm text-ink/80">
        Depletion in {unit} (lower is drier) against RAW and TAW; bars are daily rain, effective rain and net irrigation ({unit}, right
        axis). Dashed: the outlook, an estimate.
      </figcaption>
      <div className="h-80 w-full" role="img" aria-label="Chart of the field's depletion, rain, irrigation and crop ET; the same numbers are in the water account table below">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 4, bottom: 0, left: -8 }}>
            <CartesianGrid stroke="#d5eaef" vertical={false} />
            <XAxis dataKey="date" tickFormatter={(d: string) => formatLocalDate(d).slice(4)} minTickGap={24} tick={{ fontSize: 12, fill: "#17261f" }} />
            <YAxis yAxisId="depl" reversed tick={{ fontSize: 12, fill: "#17261f" }} width={44} />
            <YAxis yAxisId="flux" orientation="right" tick={{ fontSize: 12, fill: "#17261f" }} width={36} />
            <Tooltip labelFormatter={(d) => formatLocalDate(String(d), "long")} formatter={(value) => (Array.isArray(value) ? `${value[0]}–${value[1]} ${unit}` : `${value} ${unit}`)} />
            {/* Legend text in ink: the series' own light fills would be unreadable as text. */}
            <Legend wrapperStyle={{ fontSize: 12 }} formatter={(value) => <span style={{ color: "#17261f" }}>{value}</span>} />
            <Area yAxisId="depl" dataKey="rawBand" name="RAW (readily available)" fill="#d5eaef" stroke="none" isAnimationActive={false} />
            <Area yAxisId="depl" dataKey="tawBand" name="RAW to TAW (crop short of water)" fill="#f3dfcc" stroke="none" isAnimationActive={false} />
            <Bar yAxisId="flux" dataKey="rain" name="Rain" fill="#7fb8c7" isAnimationActive={false} />
            <Bar yAxisId="flux" dataKey="effectiveRain" name="Effective rain" fill="#1d5566" isAnimationActive={false} />
            <Bar yAxisId="flux" dataKey="irrigation" name="Irrigation (net)" fill="#6b8a4a" isAnimationActive={false} />
            <Line yAxisId="flux" dataKey="etc" name="ETc" stroke="#b8653a" dot={false} strokeWidth={1.5} isAnimationActive={false} />
            <Line yAxisId="depl" dataKey="depletion" name="Depletion" stroke="#17261f" strokeWidth={2.5} dot={false} isAnimationActive={false} />
            <Line yAxisId="depl" dataKey="outlook" name="Outlook" stroke="#17261f" strokeDasharray="6 4" strokeWidth={2} dot={false} isAnimationActive={false} />
            <Line yAxisId="depl" dataKey="trigger" name="Trigger" stroke="#7e3f1f" strokeWidth={1.5} dot={false} isAnimationActive={false} />
            <ReferenceLine yAxisId="depl" x={today} stroke="#0f3340" label={{ value: "today", position: "insideTopLeft", fontSize: 11, fill: "#0f3340" }} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
