import "server-only";
import PgBoss from "pg-boss";
import { env } from "@/lib/env";

/** Names of Rootbank's background jobs. */
export const JOBS = {
  maintenance: "maintenance",
} as const;

const globalForBoss = globalThis as unknown as { rootbankBoss?: Promise<PgBoss> };

/** The PostgreSQL-backed job queue, shared by every app server and worker process. */
export function queue(): Promise<PgBoss> {
  globalForBoss.rootbankBoss ??= (async () => {
    const boss = new PgBoss({ connectionString: env().DATABASE_URL, schema: "jobs" });
    boss.on("error", (err: unknown) => console.error("job queue:", err));
    await boss.start();
    for (const name of Object.values(JOBS)) await boss.createQueue(name);
    return boss;
  })();
  return globalForBoss.rootbankBoss;
}
