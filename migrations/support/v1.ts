/**
 * Column habits shared by the v1 migrations. Migrations already applied must replay identically, so this
 * module is frozen with them: a later migration that needs different habits gets its own helper.
 * It lives in a sub-folder because Knex treats every .ts file directly in migrations/ as a migration.
 */
import type { Knex } from "knex";

/** The uuid primary key; a client may send its own id so an offline submission replayed is recognised. */
export function uuidId(knex: Knex, t: Knex.CreateTableBuilder): void {
  t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
}

/** created_at / updated_at, both timezone-aware; updated_at is kept current by the touch trigger. */
export function timestamps(knex: Knex, t: Knex.CreateTableBuilder, opts: { updated: boolean }): void {
  t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  if (opts.updated) t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
}

/**
 * Who wrote the row. Nullable because loggers, imports and the nightly job write too; set null when a
 * person is removed, so their farm's records outlive their account (the audit log keeps the story).
 */
export function attribution(t: Knex.CreateTableBuilder, opts: { updated: boolean }): void {
  t.uuid("created_by").nullable().references("id").inTable("users").onDelete("SET NULL");
  if (opts.updated) t.uuid("updated_by").nullable().references("id").inTable("users").onDelete("SET NULL");
}

/** Attaches the trigger that stamps updated_at on every update (defined in the first migration). */
export async function touchUpdatedAt(knex: Knex, table: string): Promise<void> {
  await knex.raw(
    `create trigger ?? before update on ?? for each row execute function rootbank_touch_updated_at()`,
    [`${table}_touch_updated_at`, table],
  );
}

/** The roles of DESIGN.md "Roles", in order of reach; memberships and invitations share the list. */
export const ROLES = ["owner", "manager", "agronomist", "worker", "viewer"] as const;

/** `column in ('a','b')` for a CHECK; values are constants of this file set, never user input. */
export function inList(column: string, values: readonly string[]): string {
  return `${column} in (${values.map((v) => `'${v.replace(/'/g, "''")}'`).join(", ")})`;
}
