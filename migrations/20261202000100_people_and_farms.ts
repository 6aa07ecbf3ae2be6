/**
 * v1, part 1: people, farms, who may do what on which farm, and the shared counters and audit trail.
 */
import type { Knex } from "knex";
import { attribution, inList, ROLES, timestamps, touchUpdatedAt, uuidId } from "./support/v1";

const EMAIL_CHECK = (column: string) =>
  // Stored lower-case and trimmed so uniqueness holds however the address was typed.
  `${column} = lower(btrim(${column})) and position('@' in ${column}) > 1`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create function rootbank_touch_updated_at() returns trigger language plpgsql as $$
    begin
      -- A writer that sets updated_at itself (an import replaying history) keeps its value.
      if new.updated_at is not distinct from old.updated_at then
        new.updated_at := now();
      end if;
      return new;
    end $$`);

  // Local days are the unit of the water account, so a farm's zone must be one PostgreSQL can convert with.
  // Declared immutable so a CHECK may call it; the zone database changes rarely and only by adding names.
  await knex.raw(`
    create function rootbank_is_time_zone(tz text) returns boolean language plpgsql immutable as $$
    begin
      perform now() at time zone tz;
      return true;
    exception when invalid_parameter_value then
      return false;
    end $$`);

  await knex.schema.createTable("users", (t) => {
    uuidId(knex, t);
    t.text("email").notNullable().unique();
    t.text("name").notNullable();
    t.text("password_hash").nullable();
    // Signed sessions issued before this instant are stale after a reset (sessions are stateless tokens).
    t.timestamp("password_changed_at", { useTz: true }).nullable();
    t.text("unit_system").notNullable().defaultTo("metric");
    timestamps(knex, t, { updated: true });
    t.check(EMAIL_CHECK("email"), [], "users_email_check");
    t.check(inList("unit_system", ["metric", "imperial"]), [], "users_unit_system_check");
    t.check("length(btrim(name)) > 0", [], "users_name_check");
  });
  await touchUpdatedAt(knex, "users");

  await knex.schema.createTable("farms", (t) => {
    uuidId(knex, t);
    t.text("name").notNullable();
    t.text("time_zone").notNullable();
    t.text("unit_system").notNullable().defaultTo("metric");
    t.double("latitude").nullable();
    t.double("longitude").nullable();
    t.double("elevation_m").nullable();
    t.integer("rain_day_boundary_hour").notNullable().defaultTo(9);
    t.double("allocation_ml").nullable();
    t.double("carryover_ml").notNullable().defaultTo(0);
    t.integer("water_year_start_month").notNullable().defaultTo(7);
    t.boolean("count_flagged_values").notNullable().defaultTo(false);
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.check("length(btrim(name)) > 0", [], "farms_name_check");
    t.check("rootbank_is_time_zone(time_zone)", [], "farms_time_zone_check");
    t.check(inList("unit_system", ["metric", "imperial"]), [], "farms_unit_system_check");
    t.check("latitude between -90 and 90", [], "farms_latitude_check");
    t.check("longitude between -180 and 180", [], "farms_longitude_check");
    // Dead Sea shore to high plateaus; anything outside is a typo in feet or a sign slip.
    t.check("elevation_m between -450 and 6000", [], "farms_elevation_check");
    t.check("rain_day_boundary_hour between 0 and 23", [], "farms_rain_day_boundary_check");
    t.check("allocation_ml >= 0 and carryover_ml >= 0", [], "farms_water_volumes_check");
    t.check("water_year_start_month between 1 and 12", [], "farms_water_year_check");
  });
  await touchUpdatedAt(knex, "farms");

  await knex.schema.createTable("memberships", (t) => {
    t.uuid("user_id").notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("role").notNullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.primary(["user_id", "farm_id"]);
    t.index(["farm_id"]);
    t.check(inList("role", ROLES), [], "memberships_role_check");
  });
  await touchUpdatedAt(knex, "memberships");

  await knex.schema.createTable("invitations", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("email").notNullable();
    t.text("role").notNullable();
    t.text("token_hash").notNullable().unique();
    t.uuid("invited_by").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("accepted_at", { useTz: true }).nullable();
    t.uuid("accepted_by").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.timestamp("revoked_at", { useTz: true }).nullable();
    timestamps(knex, t, { updated: false });
    t.index(["farm_id"]);
    t.index(["email"]);
    t.check(EMAIL_CHECK("email"), [], "invitations_email_check");
    t.check(inList("role", ROLES), [], "invitations_role_check");
  });

  await knex.schema.createTable("password_resets", (t) => {
    uuidId(knex, t);
    t.uuid("user_id").notNullable().references("id").inTable("users").onDelete("CASCADE");
    t.text("token_hash").notNullable().unique();
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("used_at", { useTz: true }).nullable();
    timestamps(knex, t, { updated: false });
    t.index(["user_id"]);
  });

  // Shared by every app server, so a sign-in limit holds behind a load balancer.
  await knex.schema.createTable("rate_limits", (t) => {
    t.text("key").notNullable();
    t.timestamp("window_start", { useTz: true }).notNullable();
    t.integer("count").notNullable().defaultTo(0);
    t.primary(["key", "window_start"]);
    t.index(["window_start"]); // expired windows are swept by age
    t.check("count >= 0", [], "rate_limits_count_check");
  });

  await knex.schema.createTable("audit_log", (t) => {
    t.bigIncrements("id");
    t.uuid("farm_id").nullable().references("id").inTable("farms").onDelete("CASCADE");
    t.uuid("user_id").nullable().references("id").inTable("users").onDelete("SET NULL");
    t.text("actor").notNullable();
    t.text("action").notNullable();
    t.text("entity").notNullable();
    t.text("entity_id").nullable();
    t.jsonb("before").nullable();
    t.jsonb("after").nullable();
    t.text("reason").nullable();
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["entity", "entity_id"]);
    t.check("length(actor) > 0 and length(action) > 0 and length(entity) > 0", [], "audit_log_names_check");
  });
  await knex.raw("create index audit_log_farm_id_at_index on audit_log (farm_id, at desc)");
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    "audit_log",
    "rate_limits",
    "password_resets",
    "invitations",
    "memberships",
    "farms",
    "users",
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
  await knex.raw("drop function if exists rootbank_is_time_zone(text)");
  await knex.raw("drop function if exists rootbank_touch_updated_at()");
}
