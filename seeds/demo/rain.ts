/**
 * What the demo farms' gauges recorded of the generated storms: daily readings of manual gauges (read in
 * the morning, booked to the day before) and the tips of a recording gauge.
 */
import { addDays, localInstant } from "./dates";
import { catchFactor, depthBetween, type Storm } from "./climate";
import { round, stream } from "./random";

export interface ManualReading {
  rain_date: string;
  read_at: Date;
  depth_mm: number;
  trace: boolean;
}

/** A manual gauge's depth to its graduation (0.2 mm on the usual measuring cylinder). */
function toGraduation(depthMm: number): { depth: number; trace: boolean } {
  const depth = round(Math.round(depthMm / 0.2) * 0.2, 1);
  // Wet, but less than the first graduation: the reader writes "trace".
  return { depth, trace: depth === 0 && depthMm > 0.02 };
}

/**
 * Morning readings of a manual gauge for rain days `from`..`to`: the reading at `boundaryHour` on the next
 * morning holds the rain since the previous morning and is booked to the day before. Dry days may be
 * skipped with chance `missDryDays` (a reader away); a wet day is always read.
 */
export function manualReadings(
  storms: readonly Storm[],
  place: string,
  range: { from: string; to: string },
  options: { timeZone: string; boundaryHour: number; missDryDays: number },
): ManualReading[] {
  const out: ManualReading[] = [];
  for (let day = range.from; day <= range.to; day = addDays(day, 1)) {
    const next = addDays(day, 1);
    const windowStart = localInstant(day, options.boundaryHour, options.timeZone).getTime();
    const windowEnd = localInstant(next, options.boundaryHour, options.timeZone).getTime();
    let depth = 0;
    for (const storm of storms)
      depth += depthBetween(storm, windowStart, windowEnd) * catchFactor(storm, place);
    const s = stream(place, day, "reading");
    if (depth === 0 && s.next() < options.missDryDays) continue;
    const minutesLate = s.between(-10, 25);
    const reading = toGraduation(depth);
    out.push({
      rain_date: day,
      read_at: new Date(windowEnd + minutesLate * 60_000),
      depth_mm: reading.depth,
      trace: reading.trace,
    });
  }
  return out;
}

/** A station gauge's total for one local calendar day (midnight to midnight), to 0.2 mm. */
export function calendarDayRainMm(
  storms: readonly Storm[],
  place: string,
  date: string,
  timeZone: string,
): number {
  const from = localInstant(date, 0, timeZone).getTime();
  const to = localInstant(addDays(date, 1), 0, timeZone).getTime();
  let depth = 0;
  for (const storm of storms) depth += depthBetween(storm, from, to) * catchFactor(storm, place);
  return toGraduation(depth).depth;
}

export interface Tip {
  at: Date;
  depth_mm: number;
  flagged: boolean;
  flag_reason: string | null;
}

/**
 * The tips of a tipping-bucket gauge: one record of `resolutionMm` each time the bucket fills, at the
 * instant the accumulated depth crosses the next multiple (to the second). What is left in the bucket at
 * the end of a storm evaporates. Tips after `untilMs` have not happened yet and are left out. One switch
 * bounce (a second tip a second after a real one) is added in the first thunderstorm and flagged, as
 * quality control would.
 */
export function bucketTips(
  storms: readonly Storm[],
  place: string,
  resolutionMm: number,
  untilMs: number,
): Tip[] {
  const tips: Tip[] = [];
  let bounced = false;
  for (const storm of storms) {
    const factor = catchFactor(storm, place);
    let filled = 0;
    let count = 0;
    for (const piece of storm.pieces) {
      const rateMmPerMs = (piece.depthMm * factor) / (piece.endMs - piece.startMs);
      const pieceDepth = piece.depthMm * factor;
      while (filled + pieceDepth >= (count + 1) * resolutionMm - 1e-9) {
        const needed = (count + 1) * resolutionMm - filled;
        const atMs = Math.round((piece.startMs + needed / rateMmPerMs) / 1000) * 1000;
        count++;
        if (atMs > untilMs) break;
        tips.push({ at: new Date(atMs), depth_mm: resolutionMm, flagged: false, flag_reason: null });
        if (storm.convective && !bounced && count === 5) {
          bounced = true;
          tips.push({
            at: new Date(atMs + 1000),
            depth_mm: resolutionMm,
            flagged: true,
            flag_reason: "Switch bounce: a second tip 1 s after the previous one",
          });
        }
      }
      filled += pieceDepth;
    }
  }
  // Two tips can round to the same second in a burst, and storms on consecutive days can overlap:
  // the gauge's clock still records them in order, one second apart at least.
  tips.sort((a, b) => a.at.getTime() - b.at.getTime());
  for (let i = 1; i < tips.length; i++) {
    const prev = tips[i - 1]!.at.getTime();
    if (tips[i]!.at.getTime() <= prev) tips[i]!.at = new Date(prev + 1000);
  }
  return tips;
}
