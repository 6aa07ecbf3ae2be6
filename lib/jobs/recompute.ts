import "server-only";
import { recomputeFarm, type RecomputeResult } from "@/lib/accounts/recompute";
import { requestAlerts } from "./alerts";

/** Data of a `recompute` job. */
export interface RecomputeJobData {
  farmId: string;
}

/**
 * Runs one farm's recompute for the queue. Engine refusals for single fields are logged and leave those
 * fields dirty; anything else throws so pg-boss retries the job.
 */
export async function runRecomputeJob(data: RecomputeJobData): Promise<RecomputeResult> {
  const result = await recomputeFarm(data.farmId);
  const skipped = result.skipped.length ? `, skipped ${result.skipped.map((s) => `${s.fieldId} (${s.reason})`).join("; ")}` : "";
  console.log(`recompute ${data.farmId}: ${result.fields} fields, ${result.days} days in ${Math.round(result.ms)} ms${skipped}`);
  if (result.fields > 0) await requestAlerts(data.farmId);
  return result;
}
