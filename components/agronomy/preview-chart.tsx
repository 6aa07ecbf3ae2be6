"use client";

import {
  Area,
  CartesianGrid,
  ComposedChart,
  Legend,
  Line,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import type { PreviewDayDto } from "@/lib/client/use-agronomy";
import { formatLocalDate } from "@/lib/units";

interface Point {
  date: string;
  saved?: number;
  edited?: number;
  rawBand?: [number, number];
  tawBand?: [number, number];
  savedTrigger?: number;
  editedTrigger?: number;
}

/** Saved and edited runs of the season merged by day. */
export function previewPoints(saved: readonly PreviewDayDto[], edited: readonly PreviewDayDto[]): Point[] {
  const byDate = new Map<string, Point>();
  for (const d of saved) {
    byDate.set(d.date, {
      date: d.date,
      saved: d.depletionMm,
      rawBand: [0, d.rawMm],
      tawBand: [d.rawMm, d.tawMm],
      savedTrigger: d.triggerMm,
    });
  }
  for (const d of edited) {
    const p = byDate.get(d.date) ?? { date: d.date };
    p.edited = d.depletionMm;
    p.editedTrigger = d.triggerMm;
    byDate.set(d.date, p);
  }
  return [...byDate.values()].sort((a, b) => (a.date < b.date ? -1 : 1));
}

/**
 * The season's depletion with the saved curve and with the edited one (a what-if, nothing stored),
 * against the saved RAW and TAW bands and both triggers. Down is drier, as on the field sheet.
 */
export function PreviewChart({
  saved,
  edited,
}: {
  saved: readonly PreviewDayDto[];
  edited: readonly PreviewDayDto[];
}) {
  const data = previewPoints(saved, edited);
  return (
    <figure className="flex flex-col gap-1">
      <figcaption className="text-sm text-ink/80">
        Depletion in mm since sowing (lower is drier): the saved account and the what-if with your edits,
        against RAW and TAW.
      </figcaption>
      <div
        className="h-72 w-full"
        role="img"
        aria-label="Chart of the season's depletion with the saved and the edited crop curve; the figures are summarised beside it"
        data-testid="preview-chart"
      >
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: -8 }}>
            <CartesianGrid stroke="#d5eaef" vertical={false} />
            <XAxis
              dataKey="date"
              tickFormatter={(d: string) => formatLocalDate(d).slice(4)}
              minTickGap={24}
              tick={{ fontSize: 12, fill: "#17261f" }}
            />
            <YAxis reversed tick={{ fontSize: 12, fill: "#17261f" }} width={44} />
            <Tooltip
              labelFormatter={(d) => formatLocalDate(String(d), "long")}
              formatter={(value) => (Array.isArray(value) ? `${value[0]}–${value[1]} mm` : `${value} mm`)}
            />
            <Legend
              wrapperStyle={{ fontSize: 12 }}
              formatter={(value) => <span style={{ color: "#17261f" }}>{value}</span>}
            />
            <Area
              dataKey="rawBand"
              name="RAW (saved)"
              fill="#d5eaef"
              stroke="none"
              isAnimationActive={false}
            />
            <Area
              dataKey="tawBand"
              name="RAW to TAW (saved)"
              fill="#f3dfcc"
              stroke="none"
              isAnimationActive={false}
            />
            <Line
              dataKey="savedTrigger"
              name="Trigger (saved)"
              stroke="#7e3f1f"
              strokeWidth={1}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              dataKey="editedTrigger"
              name="Trigger (what-if)"
              stroke="#b8653a"
              strokeDasharray="2 3"
              strokeWidth={1.5}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              dataKey="saved"
              name="Depletion (saved)"
              stroke="#17261f"
              strokeWidth={2.5}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              dataKey="edited"
              name="Depletion (what-if)"
              stroke="#1d7f99"
              strokeDasharray="6 4"
              strokeWidth={2.5}
              dot={false}
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
