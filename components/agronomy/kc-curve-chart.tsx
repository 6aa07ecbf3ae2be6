"use client";

import { useRef } from "react";
import { CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface CurveValues {
  kcIni: number;
  kcMid: number;
  kcEnd: number;
  stageIniDays: number;
  stageDevDays: number;
  stageMidDays: number;
  stageLateDays: number;
}

type Handle = "ini" | "dev" | "mid" | "late";

interface Point {
  day: number;
  edited?: number;
  saved?: number;
  handle?: Handle;
}

/** The four corners of the FAO-56 Kc curve (Fig. 25): end of each stage, with its Kc. */
function corners(c: CurveValues): { day: number; kc: number; handle?: Handle }[] {
  const a = c.stageIniDays;
  const b = a + c.stageDevDays;
  const m = b + c.stageMidDays;
  const e = m + c.stageLateDays;
  return [
    { day: 0, kc: c.kcIni },
    { day: a, kc: c.kcIni, handle: "ini" },
    { day: b, kc: c.kcMid, handle: "dev" },
    { day: m, kc: c.kcMid, handle: "mid" },
    { day: e, kc: c.kcEnd, handle: "late" },
  ];
}

const HEIGHT = 240;
const MARGIN = { top: 12, right: 16, bottom: 0, left: 0 };
const Y_AXIS_W = 40;
const X_AXIS_H = 30;
const KC_MAX = 2;

const STAGE_KEY: Record<Handle, keyof CurveValues> = {
  ini: "stageIniDays",
  dev: "stageDevDays",
  mid: "stageMidDays",
  late: "stageLateDays",
};
const KC_KEY: Record<Handle, keyof CurveValues> = { ini: "kcIni", dev: "kcMid", mid: "kcMid", late: "kcEnd" };
const HANDLE_NAME: Record<Handle, string> = {
  ini: "end of the initial stage (Kc ini)",
  dev: "end of development (Kc mid)",
  mid: "end of mid-season (Kc mid)",
  late: "end of the season (Kc end)",
};

/**
 * The crop's Kc curve by day after sowing: the saved curve faint, the edited one bold. The corners can
 * be dragged (up and down changes Kc, sideways the stage's length); the number inputs beside the chart
 * are the keyboard's way to the same values. Recharts has no drag, so the custom dots take pointer events
 * and the window follows the pointer until it is released.
 */
export function KcCurveChart({
  saved,
  edited,
  onChange,
}: {
  saved: CurveValues;
  edited: CurveValues;
  onChange: (next: Partial<CurveValues>) => void;
}) {
  const box = useRef<HTMLDivElement>(null);
  const savedCorners = corners(saved);
  const editedCorners = corners(edited);
  const maxDay = Math.max(savedCorners[4]!.day, editedCorners[4]!.day, 1);
  const byDay = new Map<number, Point>();
  for (const c of savedCorners) byDay.set(c.day, { ...(byDay.get(c.day) ?? { day: c.day }), saved: c.kc });
  const points: Point[] = [];
  // Edited corners each get their own point so a handle is never merged away with a saved one.
  for (const c of editedCorners)
    points.push({ day: c.day, edited: c.kc, ...(c.handle ? { handle: c.handle } : {}) });
  for (const p of byDay.values()) points.push(p);
  points.sort((a, b) => a.day - b.day);

  function startDrag(handle: Handle, e: React.PointerEvent) {
    e.preventDefault();
    const width = (box.current?.clientWidth ?? 600) - Y_AXIS_W - MARGIN.left - MARGIN.right;
    const height = HEIGHT - MARGIN.top - MARGIN.bottom - X_AXIS_H;
    const start = { x: e.clientX, y: e.clientY, kc: edited[KC_KEY[handle]], days: edited[STAGE_KEY[handle]] };
    const move = (ev: PointerEvent) => {
      const kc = Math.min(KC_MAX, Math.max(0, start.kc - ((ev.clientY - start.y) * KC_MAX) / height));
      const days = Math.max(
        handle === "ini" ? 1 : 0,
        Math.round(start.days + ((ev.clientX - start.x) * maxDay) / width),
      );
      onChange({ [KC_KEY[handle]]: Math.round(kc * 100) / 100, [STAGE_KEY[handle]]: days });
    };
    const up = () => {
      window.removeEventListener("pointermove", move);
      window.removeEventListener("pointerup", up);
    };
    window.addEventListener("pointermove", move);
    window.addEventListener("pointerup", up);
  }

  const renderDot = (props: { cx?: number; cy?: number; payload?: Point; index?: number }) => {
    const { cx, cy, payload } = props;
    if (cx === undefined || cy === undefined || !payload?.handle)
      return <g key={`none-${props.index ?? 0}`} />;
    const handle = payload.handle;
    return (
      <g key={handle} data-handle={handle}>
        <title>{`Drag the ${HANDLE_NAME[handle]}`}</title>
        <circle
          cx={cx}
          cy={cy}
          r={14}
          fill="transparent"
          style={{ cursor: "grab", touchAction: "none" }}
          onPointerDown={(e) => startDrag(handle, e)}
        />
        <circle cx={cx} cy={cy} r={6} fill="#1d5566" stroke="#fff" strokeWidth={2} pointerEvents="none" />
      </g>
    );
  };

  return (
    <figure className="flex flex-col gap-1">
      <figcaption className="text-sm text-ink/80">
        Kc by day after sowing. Grey: saved curve; blue: being edited. Drag a point, or type the values.
      </figcaption>
      <div
        ref={box}
        className="w-full select-none"
        style={{ height: HEIGHT }}
        role="img"
        aria-label="Chart of the crop coefficient curve; the same values are in the inputs beside it"
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={points} margin={MARGIN}>
            <CartesianGrid stroke="#d5eaef" vertical={false} />
            <XAxis
              dataKey="day"
              type="number"
              domain={[0, maxDay]}
              height={X_AXIS_H}
              tick={{ fontSize: 12, fill: "#17261f" }}
              unit=" d"
            />
            <YAxis
              domain={[0, KC_MAX]}
              ticks={[0, 0.5, 1, 1.5, 2]}
              width={Y_AXIS_W}
              tick={{ fontSize: 12, fill: "#17261f" }}
            />
            <Tooltip
              formatter={(v) => (typeof v === "number" ? v.toFixed(2) : String(v))}
              labelFormatter={(d) => `day ${String(d)}`}
            />
            <Line
              dataKey="saved"
              name="Saved Kc"
              stroke="#9aa8a0"
              strokeWidth={2}
              dot={false}
              connectNulls
              isAnimationActive={false}
            />
            <Line
              dataKey="edited"
              name="Edited Kc"
              stroke="#1d5566"
              strokeWidth={2.5}
              dot={renderDot}
              activeDot={false}
              connectNulls
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
