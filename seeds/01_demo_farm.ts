/**
 * The demo scenario: Kestrel Bend, an invented irrigated farm in the Riverina (NSW), part-way through its
 * summer season, and its small neighbour Ibis Flat. Everything is generated for the local date the seed
 * runs on (Australia/Sydney), or for ROOTBANK_DEMO_TODAY (YYYY-MM-DD) when set, and is the same for the
 * same date. Meant for an empty database (scripts/seed-if-empty.ts); it refuses to load twice.
 */
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { localDate } from "./demo/dates";
import { IBIS_FLAT, KESTREL_BEND } from "./demo/farms";
import { DEMO_PASSWORD, PEOPLE } from "./demo/people";
import { buildDemo, TIME_ZONE, type DemoRows, type Row } from "./demo/scenario";

/** Rows per INSERT: large enough to be quick, small enough to stay far below PostgreSQL's 65 535 parameters. */
const CHUNK = 1000;

/** The demo's local "today". */
export function demoToday(now: Date = new Date()): string {
  const fixed = process.env.ROOTBANK_DEMO_TODAY;
  if (fixed) {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(fixed) || Number.isNaN(Date.parse(`${fixed}T00:00:00Z`))) {
      throw new Error(`ROOTBANK_DEMO_TODAY must be a date like 2026-12-03, not '${fixed}'`);
    }
    return fixed;
  }
  return localDate(now, TIME_ZONE);
}

async function insertAll(trx: Knex.Transaction, table: string, rows: readonly Row[]): Promise<void> {
  for (let i = 0; i < rows.length; i += CHUNK) await trx(table).insert(rows.slice(i, i + CHUNK));
}

export async function seed(knex: Knex): Promise<void> {
  const rows: DemoRows = buildDemo(demoToday(), [KESTREL_BEND, IBIS_FLAT]);
  // Each person gets their own salt, as a real sign-up would (cost 10: the demo need not be slow to sign in).
  const hashes = await Promise.all(PEOPLE.map(() => bcrypt.hash(DEMO_PASSWORD, 10)));
  const users = rows.users.map((u, i) => ({ ...u, password_hash: hashes[i] }));

  await knex.transaction(async (trx) => {
    const taken = await trx("users")
      .whereIn(
        "email",
        PEOPLE.map((p) => p.email),
      )
      .first("email");
    if (taken) {
      throw new Error(
        `The demo is already loaded (${String(taken.email)} exists); it loads into an empty database only.`,
      );
    }
    await insertAll(trx, "users", users);
    for (const [table, tableRows] of Object.entries(rows)) {
      if (table !== "users") await insertAll(trx, table, tableRows);
    }
  });
}
