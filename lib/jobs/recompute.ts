import "server-only";
import { earliestDirtyDate } from "@/db/fields";
import { recomputeFarm, type RecomputeResult } from "@/lib/accounts/recompute";
import { farmToday } from "@/lib/farm-time";
import { runFarmQc } from "@/lib/qc/run";
import { requestAlerts } from "./alerts";

/** Data of a `recompute` job. */
export interface RecomputeJobData {
  farmId: string;
}

/**
 * Runs quality control over the days a recompute is about to rewrite, so flags on readings that came in
 * through the API, a logger or the offline queue are in place before the account counts (or leaves out)
 * the values. A failure is logged and the recompute goes on: flags never hold up an account.
 */
export async function checkDirtyDays(farmId: string): Promise<void> {
  const span = await earliestDirtyDate(farmId);
  if (!span) return;
  try {
    await runFarmQc(farmId, span.from, farmToday(span.timeZone));
  } catch (err) {
    console.error(`quality control ${farmId}:`, err);
  }
}

/**
 * Runs one farm's recompute for the queue: quality control over the stale days, then the rewrite. Engine
 * refusals for single fields are logged and leave those fields dirty; anything else throws so pg-boss
 * retries the job.
 */
export async function runRecomputeJob(data: RecomputeJobData): Promise<RecomputeResult> {
  await checkDirtyDays(data.farmId);
  const result = await recomputeFarm(data.farmId);
  const skipped = result.skipped.length ? `, skipped ${result.skipped.map((s) => `${s.fieldId} (${s.reason})`).join("; ")}` : "";
  console.log(`recompute ${data.farmId}: ${result.fields} fields, ${result.days} days in ${Math.round(result.ms)} ms${skipped}`);
  if (result.fields > 0) await requestAlerts(data.farmId);
  return result;
}
