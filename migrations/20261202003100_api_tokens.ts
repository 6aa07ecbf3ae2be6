/**
 * API tokens for rain loggers and weather stations that post on their own. Only a hash of the token is
 * kept; the token itself is shown once, when it is made.
 */
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("api_tokens", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("token_hash").notNullable().unique();
    // The first characters, so a person can tell their tokens apart without the secret.
    t.text("token_prefix").notNullable();
    // What the token may post to; ids are checked against the farm when the token is made.
    t.specificType("gauge_ids", "uuid[]").notNullable().defaultTo("{}");
    t.specificType("station_ids", "uuid[]").notNullable().defaultTo("{}");
    t.uuid("created_by").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("last_used_at", { useTz: true }).nullable();
    // Revoked tokens are kept so the audit log's `token:<name>` entries still point at something.
    t.timestamp("revoked_at", { useTz: true }).nullable();
    t.uuid("revoked_by").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.index(["farm_id"]);
    t.check("length(btrim(name)) > 0 and length(name) <= 80", [], "api_tokens_name_check");
    // A token that may post nowhere is useless; one that may post everywhere is not what loggers need.
    t.check("cardinality(gauge_ids) + cardinality(station_ids) > 0", [], "api_tokens_scope_check");
  });
  await knex.raw("create unique index api_tokens_farm_name_unique on api_tokens (farm_id, name) where revoked_at is null");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("api_tokens");
}
