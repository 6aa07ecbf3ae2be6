import "server-only";
import PgBoss from "pg-boss";
import { env } from "@/lib/env";

/** Names of Rootbank's background jobs. */
export const JOBS = {
  maintenance: "maintenance",
  /** bring one farm's dirty field accounts up to date; data: { farmId } */
  recompute: "recompute",
  /** per farm, at its local night: add the new day, refresh forecast and outlook, then alerts */
  nightly: "nightly",
  /** hourly: queues `nightly` for the farms whose local night it is (pg-boss keeps one schedule per queue) */
  nightlyTick: "nightly-tick",
  /** after a recompute: evaluate one farm's alert rules and send what is due; data: { farmId } */
  alerts: "alerts",
  /** every few minutes: send alerts held by quiet hours, digests, and retries after backoff */
  alertDeliveries: "alert-deliveries",
  /** a large uploaded file, kept in the file store until a worker imports it; data: { importId } */
  importFile: "import-file",
} as const;

const globalForBoss = globalThis as unknown as { rootbankBoss?: Promise<PgBoss> };

/** The PostgreSQL-backed job queue, shared by every app server and worker process. */
export function queue(): Promise<PgBoss> {
  globalForBoss.rootbankBoss ??= (async () => {
    const boss = new PgBoss({ connectionString: env().DATABASE_URL, schema: "jobs" });
    boss.on("error", (err: unknown) => console.error("job queue:", err));
    await boss.start();
    // 'stately': per farm (singletonKey) at most one job waiting and one running, so bursts merge.
    await boss.createQueue(JOBS.maintenance, { name: JOBS.maintenance, policy: "standard" });
    await boss.createQueue(JOBS.recompute, { name: JOBS.recompute, policy: "stately" });
    await boss.createQueue(JOBS.nightly, { name: JOBS.nightly, policy: "stately" });
    await boss.createQueue(JOBS.nightlyTick, { name: JOBS.nightlyTick, policy: "standard" });
    await boss.createQueue(JOBS.alerts, { name: JOBS.alerts, policy: "stately" });
    await boss.createQueue(JOBS.alertDeliveries, { name: JOBS.alertDeliveries, policy: "standard" });
    await boss.createQueue(JOBS.importFile, { name: JOBS.importFile, policy: "standard" });
    return boss;
  })();
  return globalForBoss.rootbankBoss;
}
