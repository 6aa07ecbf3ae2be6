/**
 * A counter beside fields.account_dirty_from, bumped by every write that marks the field dirty. The
 * recompute job clears the mark only when the counter is still what it read before loading inputs:
 * `least()` keeps the date unchanged when a later change arrives mid-run, so the date alone cannot tell
 * that the run missed something.
 */
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("fields", (t) => {
    t.bigInteger("account_dirty_seq").notNullable().defaultTo(0);
  });
  // A trigger rather than trusting every writer: any update that sets a dirty date counts, whoever writes it.
  await knex.raw(`
    create function rootbank_bump_account_dirty_seq() returns trigger language plpgsql as $$
    begin
      new.account_dirty_seq := old.account_dirty_seq + 1;
      return new;
    end $$`);
  await knex.raw(`
    create trigger fields_bump_account_dirty_seq before update of account_dirty_from on fields
    for each row when (new.account_dirty_from is not null)
    execute function rootbank_bump_account_dirty_seq()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("drop trigger if exists fields_bump_account_dirty_seq on fields");
  await knex.raw("drop function if exists rootbank_bump_account_dirty_seq()");
  await knex.schema.alterTable("fields", (t) => {
    t.dropColumn("account_dirty_seq");
  });
}
