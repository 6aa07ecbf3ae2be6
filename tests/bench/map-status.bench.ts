/**
 * The farm map's status read behind GET /api/v1/farms/:farmId/status for 2,000 fields with a year of
 * stored account days each: the query (one row per field from account_latest, which the recompute keeps),
 * the bands and the JSON body the handler answers with. (The route handler itself cannot be loaded under
 * the react-server condition outside Next; its session and membership check add one primary-key lookup.)
 * Run: DATABASE_URL=<test database> node --conditions=react-server --import tsx tests/bench/map-status.bench.ts
 * Target: median under 100 ms.
 */
import { readFileSync } from "node:fs";
import { db } from "@/db/knex";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { farmStatus } from "@/lib/accounts/status";
import { BENCH_FIELDS, createBenchFarm } from "./bench-farm";

const TARGET_MEDIAN_MS = 100;
const WARM_UP = 5;
const RUNS = 40;

function quantile(sorted: readonly number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!;
}

async function main(): Promise<void> {
  const farm = await createBenchFarm("status");
  try {
    const filled = await recomputeFarm(farm.farmId, { all: true, today: farm.today });
    console.log(`bench farm: ${filled.fields} fields, ${filled.days.toLocaleString("en")} stored account days`);
    console.log(`load average at start: ${readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" ")}`);
    const get = async () => JSON.parse(await Response.json({ data: await farmStatus(farm.farmId) }).text()) as { data: unknown[] };
    for (let k = 0; k < WARM_UP; k++) await get();
    const times: number[] = [];
    let rows = 0;
    for (let k = 0; k < RUNS; k++) {
      const t = performance.now();
      const body = await get();
      times.push(performance.now() - t);
      rows = body.data.length;
    }
    times.sort((a, b) => a - b);
    const median = quantile(times, 0.5);
    console.log(
      `status read, ${rows} of ${BENCH_FIELDS} fields: median ${median.toFixed(1)} ms, p90 ${quantile(times, 0.9).toFixed(1)} ms, ` +
        `min ${times[0]!.toFixed(1)} ms over ${RUNS} calls — target median < ${TARGET_MEDIAN_MS} ms: ${median < TARGET_MEDIAN_MS ? "met" : "NOT met"}`,
    );
  } finally {
    await farm.remove();
    await db.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
