import type { AccountDayDto } from "@/lib/client/use-field-account";
import { depthValue, formatLocalDate, type UnitSystem } from "@/lib/units";
import { Estimated } from "./why-panel";

/** The water account day by day, newest first; estimated ETo and flagged days are marked. */
export function AccountTable({ days, units }: { days: readonly AccountDayDto[]; units: UnitSystem }) {
  const digits = units === "imperial" ? 2 : 1;
  const v = (mm: number | null) => (mm === null ? "—" : depthValue(mm, units).toFixed(digits));
  const rows = [...days].reverse();
  return (
    <div className="overflow-x-auto rounded-2xl bg-white ring-1 ring-river-100" tabIndex={0} role="region" aria-label="Water account table, scrolls sideways">
      <table className="w-full min-w-[52rem] text-right text-sm tabular-nums">
        <caption className="px-4 py-2 text-left text-sm text-ink/80">Depths in {units === "imperial" ? "inches" : "mm"}; depletion at the end of each day.</caption>
        <thead className="bg-river-50 text-ink">
          <tr>
            {["Date", "ETo", "Kc", "ETc", "Ks", "Rain", "Runoff", "Effective rain", "Irrigation (net)", "Deep percolation", "Depletion", "Notes"].map((h, i) => (
              <th key={h} scope="col" className={`px-2 py-2 font-bold ${i === 0 || i === 11 ? "text-left" : ""}`}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((d) => {
            const est = (d.provenance.eto?.estimated.length ?? 0) > 0 || d.provenance.eto?.method === "hargreaves" || d.provenance.eto?.method === "filled-mean";
            const notes = [d.soilCheckReset ? "soil check" : null, d.provenance.qc ? `flag: ${d.provenance.qc}` : null, d.provenance.rain?.missing ? "rain missing" : null].filter(Boolean);
            return (
              <tr key={d.date} className="border-t border-river-100">
                <th scope="row" className="px-2 py-1.5 text-left font-normal whitespace-nowrap">
                  {formatLocalDate(d.date)}
                </th>
                <td className="px-2 py-1.5 whitespace-nowrap">
                  {v(d.etoMm)} {est && <Estimated />}
                </td>
                <td className="px-2 py-1.5">{d.kc?.toFixed(2) ?? "—"}</td>
                <td className="px-2 py-1.5">{v(d.etcMm)}</td>
                <td className="px-2 py-1.5">{d.ks?.toFixed(2) ?? "—"}</td>
                <td className="px-2 py-1.5">{v(d.rainMm)}</td>
                <td className="px-2 py-1.5">{v(d.runoffMm)}</td>
                <td className="px-2 py-1.5">{v(d.effectiveRainMm)}</td>
                <td className="px-2 py-1.5">{v(d.irrigationNetMm)}</td>
                <td className="px-2 py-1.5">{v(d.deepPercolationMm)}</td>
                <td className="px-2 py-1.5 font-bold">{v(d.depletionEndMm)}</td>
                <td className="px-2 py-1.5 text-left">{notes.join(", ")}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
