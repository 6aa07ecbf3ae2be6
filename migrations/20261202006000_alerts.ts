/**
 * Alerts: each person's rules per farm, the devices they receive Web Push on, the notifications made
 * for them (the in-app centre) and every attempt to deliver one by push or e-mail (the sent log).
 */
import type { Knex } from "knex";

const KINDS = ["field-trigger", "outlook-trigger", "rain-skip", "gauge-missed", "sensor-silent", "capacity-shortfall"];
const kindCheck = (column: string) => `${column} in (${KINDS.map((k) => `'${k}'`).join(", ")})`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("push_subscriptions", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("user_id").notNullable().references("id").inTable("users").onDelete("CASCADE");
    // The push service's URL is the device's identity: subscribing again from a device replaces its keys.
    t.text("endpoint").notNullable().unique();
    t.text("p256dh").notNullable();
    t.text("auth").notNullable();
    t.text("label").nullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("last_sent_at", { useTz: true }).nullable();
    t.index(["user_id"]);
    t.check("endpoint like 'https://%' and length(endpoint) <= 2000", [], "push_subscriptions_endpoint_check");
    t.check("length(p256dh) between 80 and 100 and length(auth) between 16 and 32", [], "push_subscriptions_keys_check");
  });

  // Only the rules a person changed are stored; the others follow their role's defaults.
  await knex.schema.createTable("alert_rules", (t) => {
    t.uuid("user_id").notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("kind").notNullable();
    t.boolean("enabled").notNullable();
    t.boolean("push").notNullable();
    t.boolean("email").notNullable();
    // days (outlook), mm (rain), hours (silence); null for rules without a threshold
    t.double("threshold").nullable();
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["user_id", "farm_id", "kind"]);
    t.check(kindCheck("kind"), [], "alert_rules_kind_check");
    t.check("threshold is null or (threshold >= 0 and threshold <= 1000)", [], "alert_rules_threshold_check");
  });

  await knex.schema.createTable("alert_settings", (t) => {
    t.uuid("user_id").notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    // Local times in the farm's zone; a start after the end spans midnight.
    t.text("quiet_start").nullable();
    t.text("quiet_end").nullable();
    t.boolean("digest_only").notNullable().defaultTo(false);
    t.integer("digest_hour").notNullable().defaultTo(6);
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["user_id", "farm_id"]);
    t.check("(quiet_start is null) = (quiet_end is null)", [], "alert_settings_quiet_pair_check");
    t.check("quiet_start ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$' and quiet_end ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$'", [], "alert_settings_quiet_format_check");
    t.check("digest_hour between 0 and 23", [], "alert_settings_digest_hour_check");
  });

  await knex.schema.createTable("notifications", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.text("kind").notNullable();
    // what the condition is about: a field, gauge or station id, or 'farm'
    t.text("subject_key").notNullable();
    t.uuid("field_id").nullable().references("id").inTable("fields").onDelete("CASCADE");
    // the farm-local day the condition holds on: one alert per condition, subject and day
    t.date("local_date").notNullable();
    t.text("title").notNullable();
    t.text("body").notNullable();
    t.text("url").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("read_at", { useTz: true }).nullable();
    t.unique(["user_id", "farm_id", "kind", "subject_key", "local_date"], { indexName: "notifications_once_per_day_unique" });
    t.index(["user_id", "farm_id", "created_at"]);
    t.check(kindCheck("kind"), [], "notifications_kind_check");
    t.check("url like '/%'", [], "notifications_url_check");
  });

  await knex.schema.createTable("notification_deliveries", (t) => {
    t.bigIncrements("id");
    t.uuid("notification_id").notNullable().references("id").inTable("notifications").onDelete("CASCADE");
    t.text("channel").notNullable();
    // kept when the device goes away, so the log still says where the attempt went
    t.uuid("subscription_id").nullable().references("id").inTable("push_subscriptions").onDelete("SET NULL");
    t.text("target").notNullable();
    t.text("status").notNullable().defaultTo("pending");
    t.integer("attempts").notNullable().defaultTo(0);
    // when to try next: now, the end of quiet hours, the digest hour, or after a backoff
    t.timestamp("due_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text("last_error").nullable();
    t.timestamp("sent_at", { useTz: true }).nullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("channel in ('push', 'email', 'digest')", [], "notification_deliveries_channel_check");
    t.check("status in ('pending', 'sent', 'failed', 'gone')", [], "notification_deliveries_status_check");
    t.check("attempts >= 0", [], "notification_deliveries_attempts_check");
    t.index(["notification_id"]);
  });
  await knex.raw("create index notification_deliveries_due on notification_deliveries (due_at) where status = 'pending'");

  // Generated on first start when the environment gives none, so every app server signs with one pair.
  await knex.schema.createTable("vapid_keys", (t) => {
    t.integer("id").primary();
    t.text("public_key").notNullable();
    t.text("private_key").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("id = 1", [], "vapid_keys_single_check");
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["vapid_keys", "notification_deliveries", "notifications", "alert_settings", "alert_rules", "push_subscriptions"]) {
    await knex.schema.dropTableIfExists(table);
  }
}
