"use client";

import { Bar, CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { APPROACHING_SHARE, type AllocationMonth } from "@/lib/statement/allocation";
import { formatNumber } from "@/lib/statement/format";
import { monthLabel } from "@/lib/statement/period";

/** Month-by-month use (bars) and the running total (line) against the limit and its 80 % mark, ML. */
export function AllocationChart({ months, limitMl }: { months: readonly AllocationMonth[]; limitMl: number | null }) {
  const data = months.map((m) => ({
    month: monthLabel(m.month).slice(0, 3),
    use: m.useM3 === null ? undefined : Math.round(m.useM3) / 1000,
    cumulative: m.cumulativeMl ?? undefined,
  }));
  const top = Math.max(limitMl ?? 0, ...months.map((m) => m.cumulativeMl ?? 0)) * 1.1 || 1;
  return (
    <figure className="h-64 w-full" aria-label="Allocation use by month, in megalitres">
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }}>
          <CartesianGrid stroke="#d5eaef" vertical={false} />
          <XAxis dataKey="month" tick={{ fontSize: 12 }} interval={0} />
          <YAxis domain={[0, top]} tick={{ fontSize: 12 }} width={44} tickFormatter={(v: number) => formatNumber(v, v < 10 ? 1 : 0)} unit="" />
          <Tooltip formatter={(v) => `${formatNumber(Number(v), 2)} ML`} />
          <Legend />
          <Bar dataKey="use" name="Used in the month" fill="#7fb8c7" isAnimationActive={false} />
          <Line dataKey="cumulative" name="Used so far this year" stroke="#1d5566" strokeWidth={2} dot={{ r: 3 }} isAnimationActive={false} />
          {limitMl !== null && (
            <>
              <ReferenceLine y={limitMl} stroke="#7e3f1f" strokeWidth={2} label={{ value: "limit", position: "insideTopRight", fontSize: 12, fill: "#7e3f1f" }} />
              <ReferenceLine
                y={limitMl * APPROACHING_SHARE}
                stroke="#b8653a"
                strokeDasharray="5 4"
                label={{ value: "80 %", position: "insideBottomRight", fontSize: 12, fill: "#7e3f1f" }}
              />
            </>
          )}
        </ComposedChart>
      </ResponsiveContainer>
    </figure>
  );
}
