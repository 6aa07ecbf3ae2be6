import "server-only";
import { farmConditions } from "@/lib/alerts/conditions";
import { sendDueDeliveries, type DeliveryRun } from "@/lib/alerts/deliver";
import { dispatch, type DispatchResult } from "@/lib/alerts/dispatch";
import { JOBS, queue } from "./queue";

/** Data of an `alerts` job. */
export interface AlertsJobData {
  farmId: string;
}

export interface AlertsRun extends DispatchResult {
  conditions: number;
  delivered: DeliveryRun;
}

/**
 * Looks at one farm after its accounts changed (or at night): records the alerts its people's rules ask
 * for and sends what is due now. What quiet hours hold back goes out with the delivery sweep.
 */
export async function runAlerts(farmId: string, now: Date = new Date()): Promise<AlertsRun> {
  const found = await farmConditions(farmId, now);
  if (!found) return { conditions: 0, created: 0, deliveries: 0, delivered: { sent: 0, retrying: 0, failed: 0, gone: 0 } };
  const result = await dispatch(found.farm, found.conditions, now);
  const delivered = await sendDueDeliveries(now);
  if (result.created) console.log(`alerts ${farmId}: ${found.conditions.length} condition(s), ${result.created} new alert(s), sent ${delivered.sent}`);
  return { conditions: found.conditions.length, ...result, delivered };
}

/** Queues an alert check for a farm; a burst of recomputes gives one check (the queue merges per farm). */
export async function requestAlerts(farmId: string): Promise<void> {
  const boss = await queue();
  await boss.send(JOBS.alerts, { farmId }, { singletonKey: farmId, retryLimit: 3, retryBackoff: true });
}

/** The sweep: held (quiet hours, digest) and backed-off deliveries whose time has come. */
export async function runDeliverySweep(now: Date = new Date()): Promise<DeliveryRun> {
  return sendDueDeliveries(now);
}
