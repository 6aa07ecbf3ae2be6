/**
 * Whole-farm recompute: 2,000 fields x 365 days, from the database reads to the account rows written.
 * Run: DATABASE_URL=<test database> node --conditions=react-server --import tsx tests/bench/recompute.bench.ts
 * Target: under 5 s on a 2-core machine.
 */
import { db } from "@/db/knex";
import { recomputeFarm, type RecomputeResult } from "@/lib/accounts/recompute";
import { BENCH_DAYS, BENCH_FIELDS, createBenchFarm } from "./bench-farm";

const TARGET_MS = 5000;

function report(label: string, r: RecomputeResult): boolean {
  const ok = r.ms < TARGET_MS;
  console.log(
    `${label}: ${r.fields} fields, ${r.days.toLocaleString("en")} field-days in ${(r.ms / 1000).toFixed(2)} s ` +
      `(${Math.round(r.days / (r.ms / 1000)).toLocaleString("en")} field-days/s) — target < ${TARGET_MS / 1000} s: ${ok ? "met" : "NOT met"}`,
  );
  if (r.skipped.length) console.log(`  skipped ${r.skipped.length}: ${r.skipped[0]?.reason}`);
  return ok;
}

async function main(): Promise<void> {
  const t0 = performance.now();
  const farm = await createBenchFarm("recompute");
  console.log(`bench farm: ${BENCH_FIELDS} fields, ${BENCH_DAYS} days of weather and rain, created in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  let ok = true;
  try {
    ok = report("first recompute (empty account)", await recomputeFarm(farm.farmId, { all: true, today: farm.today })) && ok;
    ok = report("full rewrite (delete + insert)", await recomputeFarm(farm.farmId, { all: true, today: farm.today })) && ok;
    const stored = await db("account_days as a").join("fields as f", "f.id", "a.field_id").where("f.farm_id", farm.farmId).count("* as n");
    console.log(`stored rows: ${Number(stored[0]!.n).toLocaleString("en")}`);
  } finally {
    await farm.remove();
    await db.destroy();
  }
  console.log(ok ? "recompute: all targets met" : "recompute: a target was missed");
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
