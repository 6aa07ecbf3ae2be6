/**
 * v1, part 3: what a farm owns on the ground (irrigation systems, rain gauges, weather stations), its
 * fields, and what is planted in them each season.
 */
import type { Knex } from "knex";
import { attribution, inList, timestamps, touchUpdatedAt, uuidId } from "./support/v1";

const SYSTEM_KINDS = [
  "drip",
  "micro",
  "pivot",
  "linear",
  "solid_set",
  "hand_move",
  "traveller",
  "furrow",
  "flood",
];

const LAT_LON_CHECK = "latitude between -90 and 90 and longitude between -180 and 180";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("irrigation_systems", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("kind").notNullable();
    t.double("application_efficiency").notNullable();
    t.double("flow_m3_h").nullable();
    t.double("capacity_mm_day").nullable();
    t.double("depth_per_pass_mm").nullable();
    t.text("pump_name").nullable();
    // Kept rather than deleted so old irrigation events still name their system.
    t.timestamp("archived_at", { useTz: true }).nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["farm_id"]);
    t.check("length(btrim(name)) > 0", [], "irrigation_systems_name_check");
    t.check(inList("kind", SYSTEM_KINDS), [], "irrigation_systems_kind_check");
    // Net can never exceed gross: no system delivers more water to the root zone than it pumps.
    t.check(
      "application_efficiency > 0 and application_efficiency <= 1",
      [],
      "irrigation_systems_efficiency_check",
    );
    t.check("flow_m3_h > 0 and flow_m3_h <= 100000", [], "irrigation_systems_flow_check");
    // Even flood bays do not put more than ~half a metre of water a day on a field.
    t.check("capacity_mm_day > 0 and capacity_mm_day <= 500", [], "irrigation_systems_capacity_check");
    t.check(
      "depth_per_pass_mm > 0 and depth_per_pass_mm <= 100",
      [],
      "irrigation_systems_depth_per_pass_check",
    );
  });
  await touchUpdatedAt(knex, "irrigation_systems");
  await knex.raw(
    "create unique index irrigation_systems_farm_name_unique on irrigation_systems (farm_id, name) where archived_at is null",
  );

  await knex.schema.createTable("gauges", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("kind").notNullable();
    t.double("latitude").nullable();
    t.double("longitude").nullable();
    t.double("resolution_mm").nullable();
    t.timestamp("archived_at", { useTz: true }).nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["farm_id"]);
    t.check("length(btrim(name)) > 0", [], "gauges_name_check");
    t.check(inList("kind", ["manual", "recording"]), [], "gauges_kind_check");
    t.check(LAT_LON_CHECK, [], "gauges_location_check");
    // Tipping buckets resolve 0.1-1 mm (0.2 mm or 0.01 in usual); manual gauges are read to about 0.1-0.5 mm.
    t.check("resolution_mm > 0 and resolution_mm <= 5", [], "gauges_resolution_check");
  });
  await touchUpdatedAt(knex, "gauges");
  await knex.raw(
    "create unique index gauges_farm_name_unique on gauges (farm_id, name) where archived_at is null",
  );

  await knex.schema.createTable("weather_stations", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.double("latitude").nullable();
    t.double("longitude").nullable();
    t.double("elevation_m").nullable();
    t.double("wind_height_m").notNullable().defaultTo(2);
    t.boolean("coastal").notNullable().defaultTo(false);
    t.timestamp("archived_at", { useTz: true }).nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["farm_id"]);
    t.check("length(btrim(name)) > 0", [], "weather_stations_name_check");
    t.check(LAT_LON_CHECK, [], "weather_stations_location_check");
    t.check("elevation_m between -450 and 6000", [], "weather_stations_elevation_check");
    // FAO-56 eq. 47 converts wind from any height above the crop; below 0.5 m it is not wind at all.
    t.check("wind_height_m >= 0.5 and wind_height_m <= 100", [], "weather_stations_wind_height_check");
  });
  await touchUpdatedAt(knex, "weather_stations");

  await knex.schema.createTable("fields", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").notNullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.jsonb("boundary").nullable();
    t.double("area_ha").notNullable();
    t.double("centroid_lat").nullable();
    t.double("centroid_lon").nullable();
    // No cascade: a soil or crop still in use cannot vanish from under a field's account.
    t.uuid("soil_id").nullable().references("id").inTable("soils");
    t.double("slope_pct").nullable();
    t.uuid("irrigation_system_id")
      .nullable()
      .references("id")
      .inTable("irrigation_systems")
      .onDelete("SET NULL");
    t.uuid("gauge_id").nullable().references("id").inTable("gauges").onDelete("SET NULL");
    t.double("curve_number").nullable();
    // Earliest day whose account must be rewritten; the recompute job clears it (null = up to date).
    t.date("account_dirty_from").nullable();
    t.timestamp("archived_at", { useTz: true }).nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["farm_id"]);
    t.index(["soil_id"]);
    t.check("length(btrim(name)) > 0", [], "fields_name_check");
    t.check(
      "boundary is null or (jsonb_typeof(boundary) = 'object' and boundary->>'type' in ('Polygon', 'MultiPolygon') " +
        "and jsonb_typeof(boundary->'coordinates') = 'array')",
      [],
      "fields_boundary_check",
    );
    // 100 000 ha is a county, not a field: larger is a units mistake (m² typed as ha).
    t.check("area_ha > 0 and area_ha <= 100000", [], "fields_area_check");
    t.check(
      "centroid_lat between -90 and 90 and centroid_lon between -180 and 180",
      [],
      "fields_centroid_check",
    );
    // Irrigated land steeper than 100 % (45°) is a cliff.
    t.check("slope_pct >= 0 and slope_pct <= 100", [], "fields_slope_check");
    // NRCS curve numbers run from ~30 (woods, sand) to 100 (water).
    t.check("curve_number between 30 and 100", [], "fields_curve_number_check");
  });
  await touchUpdatedAt(knex, "fields");
  await knex.raw(
    "create unique index fields_farm_name_unique on fields (farm_id, name) where archived_at is null",
  );
  await knex.raw(
    "create index fields_account_dirty_from_index on fields (account_dirty_from) where account_dirty_from is not null",
  );

  await knex.schema.createTable("plantings", (t) => {
    uuidId(knex, t);
    t.uuid("field_id").notNullable().references("id").inTable("fields").onDelete("CASCADE");
    t.text("season").notNullable();
    t.uuid("crop_id").notNullable().references("id").inTable("crops");
    t.date("planting_date").notNullable();
    t.date("end_date").nullable();
    // Overrides of the crop's values for this field and season; null = the crop's value.
    t.double("kc_ini").nullable();
    t.double("kc_mid").nullable();
    t.double("kc_end").nullable();
    t.integer("stage_ini_days").nullable();
    t.integer("stage_dev_days").nullable();
    t.integer("stage_mid_days").nullable();
    t.integer("stage_late_days").nullable();
    t.double("root_min_m").nullable();
    t.double("root_max_m").nullable();
    t.double("p").nullable();
    t.double("mad").nullable();
    t.boolean("climate_adjust").notNullable().defaultTo(true);
    t.double("initial_depletion_mm").notNullable().defaultTo(0);
    t.text("note").nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["field_id", "planting_date"]);
    t.index(["crop_id"]);
    t.check("length(btrim(season)) > 0", [], "plantings_season_check");
    // A crop is not harvested before it is sown.
    t.check("end_date >= planting_date", [], "plantings_dates_check");
    t.check(
      "kc_ini between 0 and 2 and kc_mid between 0 and 2 and kc_end between 0 and 2",
      [],
      "plantings_kc_check",
    );
    t.check(
      "stage_ini_days >= 0 and stage_dev_days >= 0 and stage_mid_days >= 0 and stage_late_days >= 0",
      [],
      "plantings_stage_days_check",
    );
    t.check(
      "root_min_m > 0 and root_max_m > 0 and root_max_m <= 5 and root_min_m <= root_max_m",
      [],
      "plantings_root_check",
    );
    t.check("p between 0.05 and 0.95", [], "plantings_p_check");
    // A trigger is a share of the total available water: above zero, below all of it.
    t.check("mad > 0 and mad < 1", [], "plantings_mad_check");
    t.check(
      "initial_depletion_mm >= 0 and initial_depletion_mm <= 2000",
      [],
      "plantings_initial_depletion_check",
    );
  });
  await touchUpdatedAt(knex, "plantings");
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["plantings", "fields", "weather_stations", "gauges", "irrigation_systems"]) {
    await knex.schema.dropTableIfExists(table);
  }
}
