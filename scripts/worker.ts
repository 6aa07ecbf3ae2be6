/**
 * Rootbank's background worker. Any number of these can run against one PostgreSQL: the job queue
 * (pg-boss) hands each job to one of them.
 */
import { db } from "@/db/knex";
import { runMaintenance } from "@/lib/jobs/maintenance";
import { JOBS, queue } from "@/lib/jobs/queue";

async function main(): Promise<void> {
  const boss = await queue();
  await boss.schedule(JOBS.maintenance, "17 * * * *");
  await boss.work(JOBS.maintenance, async () => {
    const removed = await runMaintenance();
    console.log(`maintenance: removed ${JSON.stringify(removed)}`);
  });
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
