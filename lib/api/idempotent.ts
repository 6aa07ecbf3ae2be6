import "server-only";
import type { Knex } from "knex";
import { AppError } from "./errors";

/**
 * Inserts a row whose id the client may have chosen (offline entries carry their own uuid). Sending the
 * same id again returns the stored row instead of a second one; an id already used by another farm's
 * row is a conflict, and reveals nothing about it.
 */
export async function insertOnce<Row extends { id: string }>(
  trx: Knex | Knex.Transaction,
  table: string,
  row: Record<string, unknown> & { id?: string },
  belongs: (existing: Row) => boolean | Promise<boolean>,
): Promise<{ row: Row; created: boolean }> {
  const [inserted] = (await trx(table).insert(row).onConflict("id").ignore().returning("*")) as Row[];
  if (inserted) return { row: inserted, created: true };
  const existing = (await trx(table).where({ id: row.id }).first()) as Row | undefined;
  if (!existing || !(await belongs(existing))) {
    throw new AppError("conflict", "That id is already in use. Generate a new one for a new entry.", { id: "Already in use" });
  }
  return { row: existing, created: false };
}
