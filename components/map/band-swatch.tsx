import { BANDS, type MapBand } from "./bands";

/** The band's colour with its name, so colour is never the only sign. */
export function BandChip({ band }: { band: MapBand }) {
  const b = BANDS[band];
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full px-2 py-0.5 text-xs font-bold" style={{ backgroundColor: b.fill, color: b.text }}>
      {b.label}
    </span>
  );
}

export function BandLegend({ className = "" }: { className?: string }) {
  return (
    <div className={`rounded-xl bg-white/95 p-2 text-xs shadow ring-1 ring-river-100 ${className}`}>
      <p className="mb-1 font-bold">Status bands, wet to dry</p>
      <ul className="grid grid-cols-2 gap-x-3 gap-y-0.5">
        {(["soaked", "comfortable", "drawing", "due", "parched", "unknown"] as const).map((band) => (
          <li key={band} className="flex items-center gap-2" title={BANDS[band].meaning}>
            <span aria-hidden="true" className="inline-block h-3.5 w-5 shrink-0 rounded ring-1 ring-ink/30" style={{ backgroundColor: BANDS[band].fill }} />
            <span>
              <span className="font-bold">{BANDS[band].label}</span> <span className="sr-only">: {BANDS[band].meaning}</span>
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}
