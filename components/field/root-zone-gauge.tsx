import { BANDS, type MapBand } from "@/components/map/bands";
import { formatDepth, type UnitSystem } from "@/lib/units";

/**
 * The root zone as a column of soil: field capacity at the top, wilting point at the bottom (TAW deep).
 * The water still held fills the column from below; the RAW line marks where the crop starts to go short,
 * the trigger line where Rootbank calls for water.
 */
export function RootZoneGauge({
  depletionMm,
  tawMm,
  rawMm,
  triggerMm,
  band,
  units,
}: {
  depletionMm: number;
  tawMm: number;
  rawMm: number;
  triggerMm: number;
  band: MapBand;
  units: UnitSystem;
}) {
  const H = 200;
  const top = 12;
  const y = (mm: number) => top + (Math.min(Math.max(mm, 0), tawMm) / tawMm) * H;
  const leftMm = Math.max(tawMm - depletionMm, 0);
  const pct = Math.round((leftMm / tawMm) * 100);
  return (
    <figure className="flex items-center gap-4">
      <svg viewBox="0 0 150 228" className="h-56 w-36 shrink-0" role="img" aria-label={`Root zone: ${pct} % of TAW left; depletion ${formatDepth(depletionMm, units)} of TAW ${formatDepth(tawMm, units)}, RAW ${formatDepth(rawMm, units)}`}>
        <rect x="10" y={top} width="60" height={H} rx="6" fill="#f3dfcc" stroke="#17261f" strokeWidth="1.5" />
        <rect x="10" y={y(depletionMm)} width="60" height={top + H - y(depletionMm)} rx="0" fill={BANDS[band].fill} opacity="0.9" />
        <rect x="10" y={top} width="60" height={H} rx="6" fill="none" stroke="#17261f" strokeWidth="1.5" />
        <line x1="4" x2="76" y1={y(rawMm)} y2={y(rawMm)} stroke="#7e3f1f" strokeWidth="2" strokeDasharray="5 3" />
        <text x="80" y={y(rawMm) + 4} fontSize="11" fill="#17261f" fontWeight="700">RAW</text>
        {Math.abs(triggerMm - rawMm) > tawMm * 0.04 && (
          <>
            <line x1="4" x2="76" y1={y(triggerMm)} y2={y(triggerMm)} stroke="#0f3340" strokeWidth="2" />
            <text x="80" y={y(triggerMm) + 4} fontSize="11" fill="#17261f" fontWeight="700">trigger</text>
          </>
        )}
        <path d={`M0 ${y(depletionMm) - 6} L8 ${y(depletionMm)} L0 ${y(depletionMm) + 6} Z`} fill="#17261f" />
        <text x="80" y={top + 4} fontSize="10" fill="#17261f">field capacity</text>
        <text x="80" y={top + H} fontSize="10" fill="#17261f">wilting point</text>
      </svg>
      <figcaption className="flex flex-col gap-1 text-sm">
        <span className="text-3xl font-bold">{pct} %</span>
        <span>of the root zone&apos;s TAW left</span>
        <span>
          Depletion <span className="font-bold">{formatDepth(depletionMm, units)}</span> of TAW {formatDepth(tawMm, units)}
        </span>
        <span>
          RAW {formatDepth(rawMm, units)} · trigger {formatDepth(triggerMm, units)}
        </span>
      </figcaption>
    </figure>
  );
}
