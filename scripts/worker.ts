/**
 * Rootbank's background worker. Any number of these can run against one PostgreSQL: the job queue
 * (pg-boss) hands each job to one of them.
 */
import { db } from "@/db/knex";
import { requestPendingRecomputes } from "@/lib/accounts/dirty";
import { runAlerts, runDeliverySweep, type AlertsJobData } from "@/lib/jobs/alerts";
import type { ImportJobData } from "@/lib/imports/background";
import { runImportJob } from "@/lib/jobs/imports";
import { runMaintenance } from "@/lib/jobs/maintenance";
import { runNightly, runNightlyTick } from "@/lib/jobs/nightly";
import { JOBS, queue } from "@/lib/jobs/queue";
import { runRecomputeJob, type RecomputeJobData } from "@/lib/jobs/recompute";

/** Recomputes run side by side per worker process: a farm's rewrite is mostly database time. */
const RECOMPUTE_CONCURRENCY = 2;

async function main(): Promise<void> {
  const boss = await queue();
  await boss.schedule(JOBS.maintenance, "17 * * * *");
  await boss.work(JOBS.maintenance, async () => {
    const removed = await runMaintenance();
    console.log(`maintenance: removed ${JSON.stringify(removed)}`);
  });

  // pg-boss 10 runs one job at a time per work() call, so concurrency is several registrations.
  for (let k = 0; k < RECOMPUTE_CONCURRENCY; k++) {
    await boss.work<RecomputeJobData>(JOBS.recompute, async ([job]) => {
      if (job) await runRecomputeJob(job.data);
    });
  }
  await boss.work<{ farmId: string }>(JOBS.nightly, async ([job]) => {
    if (job) await runNightly(job.data.farmId);
  });
  // On the hour: farms whose local time is then 02:xx get their night (zones with half-hour offsets too).
  await boss.schedule(JOBS.nightlyTick, "0 * * * *");
  await boss.work(JOBS.nightlyTick, async () => {
    const farms = await runNightlyTick();
    if (farms.length) console.log(`nightly: queued ${farms.length} farm(s)`);
  });
  await boss.work<AlertsJobData>(JOBS.alerts, async ([job]) => {
    if (job) await runAlerts(job.data.farmId);
  });
  await boss.schedule(JOBS.alertDeliveries, "*/5 * * * *");
  await boss.work(JOBS.alertDeliveries, async () => {
    const run = await runDeliverySweep();
    if (run.sent + run.failed + run.gone) console.log(`alert deliveries: ${JSON.stringify(run)}`);
  });
  await boss.work<ImportJobData>(JOBS.importFile, async ([job]) => {
    if (job) console.log(`import ${job.data.importId}: ${await runImportJob(job.data)}`);
  });
  const pending = await requestPendingRecomputes();
  if (pending.length) console.log(`worker: queued the recompute of ${pending.length} farm(s) with stale accounts`);
  console.log("worker: waiting for jobs");

  const stop = async () => {
    await boss.stop({ graceful: true, timeout: 10_000 });
    await db.destroy();
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop());
  process.on("SIGINT", () => void stop());
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
