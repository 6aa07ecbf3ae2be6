import "server-only";
import { db } from "./knex";

/** One change of a planting, crop or soil as the audit log recorded it. */
export interface HistoryEntry {
  id: string;
  at: string;
  action: string;
  actor: string;
  userName: string | null;
  userEmail: string | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

type Row = {
  id: string | number;
  at: Date;
  action: string;
  actor: string;
  name: string | null;
  email: string | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
};

export function toHistoryEntry(r: Row): HistoryEntry {
  return {
    id: String(r.id),
    at: new Date(r.at).toISOString(),
    action: r.action,
    actor: r.actor,
    userName: r.name,
    userEmail: r.email,
    reason: r.reason,
    before: r.before,
    after: r.after,
  };
}

/** The audit entries of one planting, crop or soil of this farm, newest first (at most `limit`). */
export async function listHistory(
  farmId: string,
  entity: "planting" | "crop" | "soil",
  entityId: string,
  limit = 200,
): Promise<HistoryEntry[]> {
  const rows = (await db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.user_id")
    .where({ "a.farm_id": farmId, "a.entity": entity, "a.entity_id": entityId })
    .orderBy([
      { column: "a.at", order: "desc" },
      { column: "a.id", order: "desc" },
    ])
    .limit(limit)
    .select(
      "a.id",
      "a.at",
      "a.action",
      "a.actor",
      "a.reason",
      "a.before",
      "a.after",
      "u.name",
      "u.email",
    )) as Row[];
  return rows.map(toHistoryEntry);
}

/** Every soil check of a field in a span (informative ones too), by day then time. */
export async function listFieldChecks(
  fieldId: string,
  from: string,
  to: string,
): Promise<{ id: string; date: string; depletionMm: number; method: string; resetsAccount: boolean }[]> {
  const rows = (await db("soil_checks")
    .where("field_id", fieldId)
    .whereBetween("date", [from, to])
    .orderBy([{ column: "date" }, { column: "checked_at" }])
    .select("id", "date", "depletion_mm", "method", "resets_account")) as {
    id: string;
    date: string;
    depletion_mm: number;
    method: string;
    resets_account: boolean;
  }[];
  return rows.map((r) => ({
    id: r.id,
    date: r.date,
    depletionMm: Number(r.depletion_mm),
    method: r.method,
    resetsAccount: r.resets_account,
  }));
}
