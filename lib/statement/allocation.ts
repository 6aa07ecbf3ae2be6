/**
 * Water use against the farm's licence or allocation, month by month through a water year. Pure.
 */
import { M3_PER_ML } from "@/lib/units";

/** Use at or above this share of the limit is flagged as approaching it (common practice, no source). */
export const APPROACHING_SHARE = 0.8;
/** Use at or above the whole limit (common practice, no source). */
export const REACHED_SHARE = 1;

export type AllocationLevel = "no-limit" | "within" | "approaching" | "reached";

export interface AllocationMonth {
  /** 'YYYY-MM' */
  month: string;
  /** gross irrigation of the whole farm in the month, m³; null for a month with no account day yet */
  useM3: number | null;
  /** use from the start of the water year to the end of this month, ML; null after the last account day */
  cumulativeMl: number | null;
  /** cumulative use as a share of the limit (0.8 = 80 %); null without a limit or without days */
  shareOfLimit: number | null;
}

export interface AllocationUse {
  allocationMl: number | null;
  carryoverMl: number;
  /** allocation + carryover, ML; null when the farm has no allocation set */
  limitMl: number | null;
  usedMl: number;
  shareUsed: number | null;
  level: AllocationLevel;
  months: AllocationMonth[];
}

/** Which band a share of the limit falls in. */
export function allocationLevel(shareUsed: number | null): AllocationLevel {
  if (shareUsed === null) return "no-limit";
  if (shareUsed >= REACHED_SHARE) return "reached";
  if (shareUsed >= APPROACHING_SHARE) return "approaching";
  return "within";
}

/**
 * Month-by-month and cumulative use against allocation + carryover.
 * @param months every month of the water year, 'YYYY-MM', in order
 * @param useM3ByMonth the farm's gross irrigation per month that has account days, m³
 * @param allocationMl the year's allocation, ML (null: none set)
 * @param carryoverMl water carried over from last year, ML
 */
export function allocationUse(
  months: readonly string[],
  useM3ByMonth: ReadonlyMap<string, number>,
  allocationMl: number | null,
  carryoverMl: number,
): AllocationUse {
  const limitMl = allocationMl === null ? null : allocationMl + carryoverMl;
  const lastWithDays = months.reduce((last, m, i) => (useM3ByMonth.has(m) ? i : last), -1);
  let cumulativeM3 = 0;
  const rows: AllocationMonth[] = months.map((month, i) => {
    const use = useM3ByMonth.get(month);
    if (i > lastWithDays) return { month, useM3: null, cumulativeMl: null, shareOfLimit: null };
    cumulativeM3 += use ?? 0;
    const cumulativeMl = cumulativeM3 / M3_PER_ML;
    return { month, useM3: use ?? 0, cumulativeMl, shareOfLimit: limitMl ? cumulativeMl / limitMl : null };
  });
  const usedMl = cumulativeM3 / M3_PER_ML;
  // A limit of 0 ML with any use is past it; with no use it is not yet reached.
  const shareUsed = limitMl === null ? null : limitMl > 0 ? usedMl / limitMl : usedMl > 0 ? Infinity : 0;
  return { allocationMl, carryoverMl, limitMl, usedMl, shareUsed, level: allocationLevel(shareUsed), months: rows };
}
