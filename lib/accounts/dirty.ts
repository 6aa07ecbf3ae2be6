import "server-only";
import type { Knex } from "knex";
import { db } from "@/db/knex";
import { JOBS, queue } from "@/lib/jobs/queue";

/**
 * Marks fields' accounts stale from a date: any write that changes an input (rain, weather, irrigation,
 * a soil check, planting or soil settings) calls this inside its transaction. The earliest date wins,
 * so several changes before a recompute run merge into one rewrite.
 */
export async function markFieldsDirty(
  trx: Knex | Knex.Transaction,
  target: { fieldIds: readonly string[] } | { farmId: string },
  fromDate: string,
): Promise<void> {
  const query = trx("fields").update({
    account_dirty_from: trx.raw("least(coalesce(account_dirty_from, ?::date), ?::date)", [fromDate, fromDate]),
  });
  if ("farmId" in target) await query.where({ farm_id: target.farmId });
  else if (target.fieldIds.length > 0) await query.whereIn("id", target.fieldIds);
}

/**
 * Asks a worker to bring a farm's accounts up to date. One job per farm waits at a time (the queue
 * deduplicates on the farm), so a burst of writes gives one recompute. Call after the transaction commits.
 */
export async function requestRecompute(farmId: string): Promise<void> {
  const boss = await queue();
  await boss.send(JOBS.recompute, { farmId }, { singletonKey: farmId, retryLimit: 3, retryBackoff: true });
}

/** Marks and requests in one step, for writes that are not part of a larger transaction. */
export async function inputsChanged(farmId: string, target: { fieldIds: readonly string[] } | { farmId: string }, fromDate: string): Promise<void> {
  await markFieldsDirty(db, target, fromDate);
  await requestRecompute(farmId);
}

/**
 * Marks every live field of a farm dirty from the first sowing of its plantings (a full rewrite), or
 * from today for a field without plantings so its mark is cleared by the next run. Returns the count.
 */
export async function markSeasonDirty(trx: Knex | Knex.Transaction, farmId: string): Promise<number> {
  return trx("fields as f")
    .where("f.farm_id", farmId)
    .whereNull("f.archived_at")
    .update({
      account_dirty_from: trx.raw(
        "least(coalesce(f.account_dirty_from, 'infinity'::date), coalesce((select min(p.planting_date) from plantings p where p.field_id = f.id), current_date))",
      ),
    });
}

/**
 * Queues a recompute for every farm that has stale field accounts: a worker does this when it starts,
 * so marks left by a seed, an import cut short or a stopped worker are not left waiting for the night.
 */
export async function requestPendingRecomputes(): Promise<string[]> {
  const rows: { farm_id: string }[] = await db("fields").distinct("farm_id").whereNotNull("account_dirty_from");
  for (const row of rows) await requestRecompute(row.farm_id);
  return rows.map((r) => r.farm_id);
}
