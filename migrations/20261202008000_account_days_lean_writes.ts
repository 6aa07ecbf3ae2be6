/**
 * The water account is rewritten in bulk (a whole farm, a season per field), so its rows are kept lean:
 * - provenance documents move to account_provenance, one per distinct document per field (most days of a
 *   field share theirs), and each day names its document by a content hash;
 * - the foreign keys from account_days to fields and plantings (two key checks per written row) give way
 *   to triggers that do their delete work: a deleted field takes its days with it, a deleted planting is
 *   unlinked from its days. The writer holds key-share locks on the fields and plantings it writes for;
 * - the planting index, needed only by the old ON DELETE SET NULL, goes;
 * - account_latest keeps each field's latest stored day and its last seven days' mean crop ET, so the
 *   farm map reads one row per field instead of scanning the account.
 */
import type { Knex } from "knex";

/** Each listed field's latest day and the mean crop ET of its last seven stored days. */
const LATEST_SELECT = `
  select v.id as field_id, w.date, w.planting_id, w.depletion_end_mm, w.taw_mm, w.raw_mm, w.recent_etc_mm
    from unnest(?::uuid[]) as v(id)
    join lateral (
      select max(d.date) as date, (array_agg(d.planting_id order by d.date desc))[1] as planting_id,
             (array_agg(d.depletion_end_mm order by d.date desc))[1] as depletion_end_mm,
             (array_agg(d.taw_mm order by d.date desc))[1] as taw_mm, (array_agg(d.raw_mm order by d.date desc))[1] as raw_mm,
             avg(d.etc_mm) as recent_etc_mm
        from (select date, planting_id, depletion_end_mm, taw_mm, raw_mm, etc_mm from account_days
               where field_id = v.id order by date desc limit 7) d
      having count(*) > 0
    ) w on true`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("account_provenance", (t) => {
    t.uuid("field_id").notNullable().references("id").inTable("fields").onDelete("CASCADE");
    // md5 of the document's text: the same document is stored once per field.
    t.uuid("id").notNullable();
    t.jsonb("doc").notNullable();
    t.primary(["field_id", "id"]);
  });
  await knex.raw(`
    insert into account_provenance (field_id, id, doc)
    select distinct on (field_id, md5(provenance::text)) field_id, md5(provenance::text)::uuid, provenance from account_days`);
  await knex.schema.alterTable("account_days", (t) => {
    t.uuid("provenance_id").nullable();
  });
  await knex.raw("update account_days set provenance_id = md5(provenance::text)::uuid");
  await knex.raw("alter table account_days alter column provenance_id set not null");
  await knex.schema.alterTable("account_days", (t) => {
    t.dropColumn("provenance");
    t.dropForeign(["field_id"]);
    t.dropForeign(["planting_id"]);
    t.dropIndex(["planting_id"]);
  });

  await knex.raw(`
    create function rootbank_account_days_drop_fields() returns trigger language plpgsql as $$
    begin
      delete from account_days a using gone g where a.field_id = g.id;
      return null;
    end $$`);
  await knex.raw(`
    create trigger fields_drop_account_days after delete on fields
    referencing old table as gone for each statement execute function rootbank_account_days_drop_fields()`);
  // A planting deleted with its field leaves nothing to unlink: the field's days go with the field.
  await knex.raw(`
    create function rootbank_account_days_unlink_plantings() returns trigger language plpgsql as $$
    begin
      update account_days a set planting_id = null
        from gone g join fields f on f.id = g.field_id
       where a.field_id = g.field_id and a.planting_id = g.id;
      return null;
    end $$`);
  await knex.raw(`
    create trigger plantings_unlink_account_days after delete on plantings
    referencing old table as gone for each statement execute function rootbank_account_days_unlink_plantings()`);

  await knex.schema.createTable("account_latest", (t) => {
    t.uuid("field_id").primary().references("id").inTable("fields").onDelete("CASCADE");
    t.date("date").notNullable();
    t.uuid("planting_id").nullable().references("id").inTable("plantings").onDelete("SET NULL");
    t.double("depletion_end_mm").notNullable();
    t.double("taw_mm").nullable();
    t.double("raw_mm").nullable();
    // mean crop ET of the field's last seven stored days, mm/day
    t.double("recent_etc_mm").nullable();
  });
  const fieldIds = (await knex("account_days").distinct("field_id")) as { field_id: string }[];
  if (fieldIds.length > 0) {
    await knex.raw(
      `insert into account_latest (field_id, date, planting_id, depletion_end_mm, taw_mm, raw_mm, recent_etc_mm) ${LATEST_SELECT}`,
      [fieldIds.map((r) => r.field_id)],
    );
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("account_latest");
  await knex.raw("drop trigger if exists plantings_unlink_account_days on plantings");
  await knex.raw("drop function if exists rootbank_account_days_unlink_plantings()");
  await knex.raw("drop trigger if exists fields_drop_account_days on fields");
  await knex.raw("drop function if exists rootbank_account_days_drop_fields()");

  await knex.raw("delete from account_days a where not exists (select 1 from fields f where f.id = a.field_id)");
  await knex.raw(
    "update account_days a set planting_id = null where planting_id is not null and not exists (select 1 from plantings p where p.id = a.planting_id)",
  );
  await knex.schema.alterTable("account_days", (t) => {
    t.jsonb("provenance").notNullable().defaultTo(knex.raw("'{}'::jsonb"));
  });
  await knex.raw(
    "update account_days a set provenance = p.doc from account_provenance p where p.field_id = a.field_id and p.id = a.provenance_id",
  );
  await knex.schema.alterTable("account_days", (t) => {
    t.dropColumn("provenance_id");
    t.foreign("field_id").references("id").inTable("fields").onDelete("CASCADE");
    t.foreign("planting_id").references("id").inTable("plantings").onDelete("SET NULL");
    t.index(["planting_id"]);
  });
  await knex.schema.dropTableIfExists("account_provenance");
}
