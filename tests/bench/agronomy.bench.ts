/**
 * The crop settings screen's server work on a year-long planting: one what-if preview (the season run
 * twice, saved and edited) and one calibration (the season run once per step of the Kc scale search).
 * Run: DATABASE_URL=<test database> BENCH_FIELDS=50 node --conditions=react-server --import tsx tests/bench/agronomy.bench.ts
 * Target: a preview under 500 ms, so the what-if follows the agronomist's typing (common practice, no source).
 */
import { db } from "@/db/knex";
import { calibratePlanting, previewCurve } from "@/lib/agronomy/what-if";
import { addDaysIso } from "@/lib/waterbalance";
import { createBenchFarm } from "./bench-farm";

const TARGET_PREVIEW_MS = 500;
const ROUNDS = 10;

async function timed<T>(run: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const t = performance.now();
  const value = await run();
  return { ms: performance.now() - t, value };
}

async function main(): Promise<void> {
  const farm = await createBenchFarm("agronomy");
  try {
    const row = (await db("plantings as p")
      .join("fields as f", "f.id", "p.field_id")
      .join("soil_checks as c", "c.field_id", "f.id")
      .where("f.farm_id", farm.farmId)
      .groupBy("p.id")
      .orderByRaw("count(c.id) desc")
      .first("p.id", db.raw("count(c.id)::int as checks"))) as { id: string; checks: number } | undefined;
    if (!row) throw new Error("the bench farm has no planting with soil checks");
    // Twelve more checks through the season (invented bench values), so the Kc scale search has work to do.
    const planting = (await db("plantings").where({ id: row.id }).first("field_id", "planting_date")) as {
      field_id: string;
      planting_date: string;
    };
    const extra = Array.from({ length: 12 }, (_, k) => ({
      field_id: planting.field_id,
      date: addDaysIso(planting.planting_date, 20 + k * 25),
      depletion_mm: 25 + ((k * 7) % 30),
      method: "probe",
    })).filter((c) => c.date < farm.today);
    await db("soil_checks").insert(extra);
    row.checks += extra.length;
    const previews: number[] = [];
    let days = 0;
    for (let k = 0; k < ROUNDS; k++) {
      const { ms, value } = await timed(() =>
        previewCurve(farm.farmId, row.id, { kcMid: 1.1 + k * 0.02 }, farm.today),
      );
      previews.push(ms);
      days = value.saved.length;
    }
    const calibrations: number[] = [];
    let runs = 0;
    for (let k = 0; k < 3; k++) {
      const { ms, value } = await timed(() => calibratePlanting(farm.farmId, row.id, farm.today));
      calibrations.push(ms);
      runs = value.suggestion.evaluations;
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
    const p = median(previews);
    console.log(
      `agronomy: preview of ${days} days (two season runs): median ${p.toFixed(0)} ms over ${ROUNDS} (${(1000 / p).toFixed(1)} previews/s)`,
    );
    console.log(
      `agronomy: calibration over ${row.checks} soil checks (${runs} season runs): median ${median(calibrations).toFixed(0)} ms over 3`,
    );
    console.log(
      `agronomy: preview target ${TARGET_PREVIEW_MS} ms: ${p <= TARGET_PREVIEW_MS ? "met" : "MISSED"}`,
    );
  } finally {
    await farm.remove();
    await db.destroy();
  }
}

void main();
