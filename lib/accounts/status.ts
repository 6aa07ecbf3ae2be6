import "server-only";
import { farmStatusRows } from "@/db/accounts";

/**
 * The farm map's one row per field: where each field's account stands now, in Rootbank's status bands.
 * Bands are of our own naming (common practice for the thresholds, no source):
 * - `stressed`: depletion beyond RAW, so the crop is already short of water (Ks < 1, FAO-56 eq. 84);
 * - `due`: depletion at or past the field's trigger;
 * - `drying`: the trigger is at most {@link DRYING_WITHIN_DAYS} days away at the recent crop ET;
 * - `comfortable`: further from the trigger than that;
 * - `no-account`: nothing stored yet (no crop, no soil, or the first recompute has not run).
 */

export const DRYING_WITHIN_DAYS = 3;

export type StatusBand = "stressed" | "due" | "drying" | "comfortable" | "no-account";

export interface FieldStatus {
  id: string;
  name: string;
  depletionMm: number | null;
  tawMm: number | null;
  rawMm: number | null;
  triggerMm: number | null;
  /** whole days until depletion reaches the trigger at the last week's mean crop ET (0 when due) */
  daysUntilTrigger: number | null;
  band: StatusBand;
  lastAccountDate: string | null;
  dirty: boolean;
  dirtyFrom: string | null;
}

/** The map status of every live field of a farm, from one query. */
export async function farmStatus(farmId: string): Promise<FieldStatus[]> {
  const rows = await farmStatusRows(farmId);
  return rows.map((r) => {
    const base = { id: r.id, name: r.name, lastAccountDate: r.lastDate, dirty: r.dirtyFrom !== null, dirtyFrom: r.dirtyFrom };
    if (r.depletionMm === null || r.tawMm === null || r.rawMm === null) {
      return { ...base, depletionMm: null, tawMm: null, rawMm: null, triggerMm: null, daysUntilTrigger: null, band: "no-account" as const };
    }
    const trigger = r.mad !== null ? r.mad * r.tawMm : r.rawMm;
    const gap = trigger - r.depletionMm;
    const etc = r.recentEtcMm ?? 0;
    const days = gap <= 0 ? 0 : etc > 0 ? Math.floor(gap / etc) : null;
    const band: StatusBand =
      r.depletionMm > r.rawMm ? "stressed" : gap <= 0 ? "due" : days !== null && days <= DRYING_WITHIN_DAYS ? "drying" : "comfortable";
    return { ...base, depletionMm: r.depletionMm, tawMm: r.tawMm, rawMm: r.rawMm, triggerMm: trigger, daysUntilTrigger: days, band };
  });
}
