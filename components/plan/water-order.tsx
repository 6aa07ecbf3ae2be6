import { formatFlow, formatHours, formatLocalDate, formatVolume, type UnitSystem } from "@/lib/units";
import type { PlanRow } from "./plan-csv";

/**
 * The water order for the supplier: per field, the flow, the start day and how long it runs. Only the
 * volume that fits the plan's days is ordered; the rest waits for the next plan. Prints on its own.
 */
export function WaterOrder({ farmName, startDate, rows, units }: { farmName: string; startDate: string; rows: readonly PlanRow[]; units: UnitSystem }) {
  const placed = rows.filter((r) => r.startDate !== null);
  return (
    <section aria-labelledby="water-order" className="rb-water-order flex flex-col gap-2 rounded-2xl bg-white p-4 ring-1 ring-river-100 print:p-0 print:ring-0">
      <h2 id="water-order" className="text-lg font-bold">
        Water order · {farmName} · from {formatLocalDate(startDate, "long")}
      </h2>
      {placed.length === 0 ? (
        <p className="text-ink/80">No water to order in these days.</p>
      ) : (
        <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Water order table, scrolls sideways">
          <table className="w-full min-w-[36rem] text-left text-sm tabular-nums">
            <thead>
              <tr className="border-b-2 border-ink">
                {["Field", "System", "Flow", "Start", "Duration", "Volume"].map((h) => (
                  <th key={h} scope="col" className="px-2 py-1.5 font-bold">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {placed.map((r) => (
                <tr key={r.fieldId} className="border-b border-river-100">
                  <th scope="row" className="px-2 py-1.5 font-bold">
                    {r.field}
                  </th>
                  <td className="px-2 py-1.5">{r.system || "—"}</td>
                  <td className="px-2 py-1.5">{formatFlow(r.flowM3H, units)}</td>
                  <td className="px-2 py-1.5">{formatLocalDate(r.startDate!)}</td>
                  <td className="px-2 py-1.5">{r.durationH !== null ? formatHours(r.durationH) : "at the system's pace"}</td>
                  <td className="px-2 py-1.5">{formatVolume(r.volumeM3 - r.unplacedM3, units)}</td>
                </tr>
              ))}
            </tbody>
            <tfoot>
              <tr>
                <th scope="row" colSpan={5} className="px-2 py-1.5 text-right">
                  Total
                </th>
                <td className="px-2 py-1.5 font-bold">{formatVolume(placed.reduce((s, r) => s + r.volumeM3 - r.unplacedM3, 0), units)}</td>
              </tr>
            </tfoot>
          </table>
        </div>
      )}
      <p className="text-xs text-ink/80">Estimated from Rootbank&apos;s water accounts; confirm with a field check and order within your licence and local water rules.</p>
    </section>
  );
}
