/**
 * Imports (one row per uploaded file, with its progress and report) and quality-control flags (one row
 * per suspect value and rule; the value itself is kept and marked, never deleted).
 */
import type { Knex } from "knex";

const IMPORT_KINDS = ["weather_csv", "rain_csv", "gauge_readings_csv", "boundaries"];
const IMPORT_STATUSES = ["processing", "done", "rejected", "failed"];
const FLAG_ENTITIES = ["rain_reading", "rain_record", "weather_day"];
const FLAG_STATUSES = ["open", "accepted", "overridden"];

function inList(column: string, values: readonly string[]): string {
  return `${column} in (${values.map((v) => `'${v}'`).join(", ")})`;
}

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("imports", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("kind").notNullable();
    t.text("file_name").notNullable();
    t.bigInteger("size_bytes").notNullable();
    // sha256 of the file's bytes, and of bytes + kind + options: the same upload twice is recognised.
    t.text("file_hash").notNullable();
    t.text("fingerprint").notNullable();
    t.jsonb("options").notNullable().defaultTo("{}");
    t.text("status").notNullable().defaultTo("processing");
    t.double("progress").notNullable().defaultTo(0);
    t.integer("total_rows").notNullable().defaultTo(0);
    t.integer("accepted_rows").notNullable().defaultTo(0);
    t.integer("rejected_rows").notNullable().defaultTo(0);
    t.integer("inserted").notNullable().defaultTo(0);
    t.integer("updated").notNullable().defaultTo(0);
    t.integer("unchanged").notNullable().defaultTo(0);
    t.jsonb("report").nullable();
    t.uuid("created_by").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("finished_at", { useTz: true }).nullable();
    t.index(["farm_id", "created_at"]);
    t.check(inList("kind", IMPORT_KINDS), [], "imports_kind_check");
    t.check(inList("status", IMPORT_STATUSES), [], "imports_status_check");
    t.check("progress >= 0 and progress <= 1", [], "imports_progress_check");
    t.check("size_bytes >= 0", [], "imports_size_check");
  });
  // One live or finished import per farm and fingerprint; a rejected or failed one may be tried again.
  await knex.raw(
    "create unique index imports_farm_fingerprint_unique on imports (farm_id, fingerprint) where status in ('processing', 'done')",
  );

  await knex.schema.createTable("qc_flags", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("entity").notNullable();
    // text, because rain_records are keyed by bigint and the others by uuid
    t.text("entity_id").notNullable();
    t.date("date").notNullable();
    t.text("rule").notNullable();
    t.text("message").notNullable();
    t.text("status").notNullable().defaultTo("open");
    t.text("reason").nullable();
    t.uuid("decided_by").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.timestamp("decided_at", { useTz: true }).nullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["entity", "entity_id", "rule"], { indexName: "qc_flags_entity_rule_unique" });
    t.index(["farm_id", "status", "date"]);
    t.check(inList("entity", FLAG_ENTITIES), [], "qc_flags_entity_check");
    t.check(inList("status", FLAG_STATUSES), [], "qc_flags_status_check");
    t.check("length(btrim(rule)) > 0", [], "qc_flags_rule_check");
    // Setting a value aside is a judgement someone must be able to explain later.
    t.check(
      "status <> 'overridden' or length(btrim(coalesce(reason, ''))) > 0",
      [],
      "qc_flags_override_reason_check",
    );
    t.check("(status = 'open') = (decided_at is null)", [], "qc_flags_decision_check");
  });
  await knex.raw(
    "create trigger qc_flags_touch_updated_at before update on qc_flags for each row execute function rootbank_touch_updated_at()",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("qc_flags");
  await knex.schema.dropTableIfExists("imports");
}
