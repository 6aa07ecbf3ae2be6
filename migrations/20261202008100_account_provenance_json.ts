/**
 * Provenance documents are written in bulk (a season of a farm's fields at once) and read back whole,
 * never searched inside: they are kept as json (checked, not converted), and without a foreign key to
 * fields (a field's delete trigger takes its documents along with its days).
 */
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("account_provenance", (t) => {
    t.dropForeign(["field_id"]);
  });
  await knex.raw("alter table account_provenance alter column doc type json using doc::json");
  await knex.raw(`
    create or replace function rootbank_account_days_drop_fields() returns trigger language plpgsql as $$
    begin
      delete from account_days a using gone g where a.field_id = g.id;
      delete from account_provenance p using gone g where p.field_id = g.id;
      return null;
    end $$`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    create or replace function rootbank_account_days_drop_fields() returns trigger language plpgsql as $$
    begin
      delete from account_days a using gone g where a.field_id = g.id;
      return null;
    end $$`);
  await knex.raw("delete from account_provenance p where not exists (select 1 from fields f where f.id = p.field_id)");
  await knex.raw("alter table account_provenance alter column doc type jsonb using doc::jsonb");
  await knex.schema.alterTable("account_provenance", (t) => {
    t.foreign("field_id").references("id").inTable("fields").onDelete("CASCADE");
  });
}
