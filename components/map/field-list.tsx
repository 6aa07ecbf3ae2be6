import Link from "next/link";
import type { FieldStatusDto } from "@/lib/client/use-farm-status";
import { formatDepth, type UnitSystem } from "@/lib/units";
import { BandChip } from "./band-swatch";
import { mapBand, triggerWords } from "./bands";

/** The map's fields as a list, most urgent first: quick to scan, and the way in for screen readers. */
export function FieldList({ farmId, statuses, units }: { farmId: string; statuses: readonly FieldStatusDto[]; units: UnitSystem }) {
  if (statuses.length === 0) return <p className="p-4 text-ink/80">This farm has no fields yet.</p>;
  return (
    <ol aria-label="Fields by urgency" className="flex flex-col divide-y divide-river-100">
      {statuses.map((s) => (
        <li key={s.id}>
          <Link href={`/farms/${farmId}/fields/${s.id}`} className="tap flex flex-col gap-1 px-4 py-3 hover:bg-river-50">
            <span className="flex items-center justify-between gap-2">
              <span className="text-lg font-bold">{s.name}</span>
              <BandChip band={mapBand(s)} />
            </span>
            <span className="text-sm text-ink/85">
              {s.depletionMm === null ? (
                "No water account yet"
              ) : (
                <>
                  Depletion {formatDepth(s.depletionMm, units)} of TAW {formatDepth(s.tawMm, units)} · {triggerWords(s)}
                </>
              )}
              {s.dirty && <span className="ml-1 font-bold text-clay-700">· being updated</span>}
            </span>
          </Link>
        </li>
      ))}
    </ol>
  );
}
