import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";

export interface AuditEntry {
  farmId: string | null;
  userId: string | null;
  actor?: string;
  action: string;
  entity: string;
  entityId: string;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
}

/** Records who changed what. Pass the transaction so the record and the change land together. */
export async function audit(entry: AuditEntry, trx: Knex | Knex.Transaction = db): Promise<void> {
  await trx("audit_log").insert({
    farm_id: entry.farmId,
    user_id: entry.userId,
    actor: entry.actor ?? (entry.userId ? "user" : "system"),
    action: entry.action,
    entity: entry.entity,
    entity_id: entry.entityId,
    before: entry.before === undefined ? null : JSON.stringify(entry.before),
    after: entry.after === undefined ? null : JSON.stringify(entry.after),
    reason: entry.reason ?? null,
  });
}
