/**
 * v1, part 4: what is measured and logged day to day: rain (daily readings and time-stamped records),
 * weather days, irrigation events and soil checks.
 */
import type { Knex } from "knex";
import { attribution, inList, timestamps, touchUpdatedAt, uuidId } from "./support/v1";

/**
 * Quality control flags a suspect value and keeps it (REFERENCES "facts of practice"); whether flagged
 * values count is the farm's choice (farms.count_flagged_values).
 */
function qualityFlag(t: Knex.CreateTableBuilder): void {
  t.boolean("flagged").notNullable().defaultTo(false);
  t.text("flag_reason").nullable();
}

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("rain_readings", (t) => {
    uuidId(knex, t);
    t.uuid("gauge_id").notNullable().references("id").inTable("gauges").onDelete("CASCADE");
    t.timestamp("read_at", { useTz: true }).notNullable();
    t.date("rain_date").notNullable();
    t.double("depth_mm").notNullable();
    t.boolean("trace").notNullable().defaultTo(false);
    t.text("photo_path").nullable();
    t.text("note").nullable();
    qualityFlag(t);
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.unique(["gauge_id", "rain_date"], { indexName: "rain_readings_gauge_day_unique" });
    // The wettest day ever recorded (La Réunion, 1966) was about 1 825 mm; a farm gauge overflows long
    // before that, and 1 000 mm in a day is beyond any plausible reading in irrigated country.
    t.check("depth_mm >= 0 and depth_mm <= 1000", [], "rain_readings_depth_check");
  });
  await touchUpdatedAt(knex, "rain_readings");

  await knex.schema.createTable("rain_records", (t) => {
    t.bigIncrements("id");
    t.uuid("gauge_id").notNullable().references("id").inTable("gauges").onDelete("CASCADE");
    t.timestamp("at", { useTz: true }).notNullable();
    t.double("depth_mm").notNullable();
    t.integer("interval_s").nullable();
    qualityFlag(t);
    attribution(t, { updated: false });
    timestamps(knex, t, { updated: false });
    t.unique(["gauge_id", "at"], { indexName: "rain_records_gauge_at_unique" });
    // A record is rain that fell: zero is no record, and 500 mm in one interval exceeds any storm burst.
    t.check("depth_mm > 0 and depth_mm <= 500", [], "rain_records_depth_check");
    // Logger intervals are whole seconds, at most a day (a daily total belongs in rain_readings).
    t.check("interval_s > 0 and interval_s <= 86400", [], "rain_records_interval_check");
  });

  await knex.schema.createTable("weather_days", (t) => {
    uuidId(knex, t);
    t.uuid("station_id").notNullable().references("id").inTable("weather_stations").onDelete("CASCADE");
    t.date("date").notNullable();
    t.text("kind").notNullable();
    // Every measurement may be missing: FAO-56 ch. 3 estimates what is absent, and the account says so.
    t.double("tmax_c").nullable();
    t.double("tmin_c").nullable();
    t.double("rh_max_pct").nullable();
    t.double("rh_min_pct").nullable();
    t.double("rh_mean_pct").nullable();
    t.double("wind_ms").nullable();
    t.double("solar_mj_m2").nullable();
    t.double("sunshine_h").nullable();
    t.double("rain_mm").nullable();
    t.double("eto_mm").nullable();
    t.text("source").nullable();
    qualityFlag(t);
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.unique(["station_id", "date", "kind"], { indexName: "weather_days_station_date_kind_unique" });
    t.check(inList("kind", ["observed", "forecast"]), [], "weather_days_kind_check");
    // The day's maximum is at least its minimum; both within what air near the ground has reached.
    t.check(
      "tmax_c >= tmin_c and tmax_c between -90 and 60 and tmin_c between -90 and 60",
      [],
      "weather_days_temperature_check",
    );
    // Relative humidity is a percentage of saturation; the day's minimum cannot exceed its maximum.
    t.check(
      "rh_max_pct between 0 and 100 and rh_min_pct between 0 and 100 and rh_mean_pct between 0 and 100 " +
        "and rh_min_pct <= rh_max_pct",
      [],
      "weather_days_humidity_check",
    );
    // A daily mean wind speed is never negative, and above 60 m/s it is a cyclone, not a farm day.
    t.check("wind_ms >= 0 and wind_ms <= 60", [], "weather_days_wind_check");
    // Solar radiation at the surface is never negative and never above extraterrestrial (~45 MJ/m²/day max).
    t.check("solar_mj_m2 >= 0 and solar_mj_m2 <= 50", [], "weather_days_solar_check");
    t.check("sunshine_h >= 0 and sunshine_h <= 24", [], "weather_days_sunshine_check");
    t.check("rain_mm >= 0 and rain_mm <= 1000", [], "weather_days_rain_check");
    // Reference ET is bounded by the energy available: about 15 mm/day in the hottest, windiest deserts.
    t.check("eto_mm >= 0 and eto_mm <= 30", [], "weather_days_eto_check");
  });
  await touchUpdatedAt(knex, "weather_days");

  await knex.schema.createTable("irrigation_events", (t) => {
    uuidId(knex, t);
    t.uuid("field_id").notNullable().references("id").inTable("fields").onDelete("CASCADE");
    t.uuid("system_id").nullable().references("id").inTable("irrigation_systems").onDelete("SET NULL");
    t.timestamp("started_at", { useTz: true }).notNullable();
    t.timestamp("ended_at", { useTz: true }).nullable();
    t.date("date").notNullable();
    t.double("gross_depth_mm").notNullable();
    t.double("net_depth_mm").nullable();
    t.double("volume_m3").nullable();
    t.double("meter_start").nullable();
    t.double("meter_end").nullable();
    t.double("hours").nullable();
    t.text("method").notNullable();
    t.text("note").nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["field_id", "date"]);
    t.index(["system_id", "started_at"]); // pump and system load when planning
    t.check(inList("method", ["depth", "volume", "hours", "meter"]), [], "irrigation_events_method_check");
    // Water is applied, never removed; 500 mm at once is a flooded bay several times over.
    t.check(
      "gross_depth_mm >= 0 and gross_depth_mm <= 500 and net_depth_mm >= 0 and net_depth_mm <= 500",
      [],
      "irrigation_events_depth_check",
    );
    t.check("ended_at >= started_at", [], "irrigation_events_times_check");
    t.check("volume_m3 >= 0 and hours >= 0 and hours <= 744", [], "irrigation_events_amounts_check");
    // A meter only counts up; a meter swapped mid-set is logged as two events.
    t.check("meter_start >= 0 and meter_end >= meter_start", [], "irrigation_events_meter_check");
    // The method names the quantity that was logged, so that quantity must be there.
    t.check(
      "(method <> 'volume' or volume_m3 is not null) and (method <> 'hours' or hours is not null) " +
        "and (method <> 'meter' or (meter_start is not null and meter_end is not null))",
      [],
      "irrigation_events_method_inputs_check",
    );
  });
  await touchUpdatedAt(knex, "irrigation_events");

  await knex.schema.createTable("soil_checks", (t) => {
    uuidId(knex, t);
    t.uuid("field_id").notNullable().references("id").inTable("fields").onDelete("CASCADE");
    t.date("date").notNullable();
    t.timestamp("checked_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.double("depletion_mm").notNullable();
    t.text("method").notNullable();
    t.double("depth_m").nullable();
    // An informative check (a second opinion, a probe calibration) may leave the account as it is.
    t.boolean("resets_account").notNullable().defaultTo(true);
    t.text("note").nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["field_id", "date"]);
    // Depletion is water missing below field capacity: zero at the wettest the root zone holds.
    t.check("depletion_mm >= 0 and depletion_mm <= 2000", [], "soil_checks_depletion_check");
    t.check(inList("method", ["probe", "feel", "sensor", "gravimetric"]), [], "soil_checks_method_check");
    t.check("depth_m > 0 and depth_m <= 5", [], "soil_checks_depth_check");
  });
  await touchUpdatedAt(knex, "soil_checks");
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["soil_checks", "irrigation_events", "weather_days", "rain_records", "rain_readings"]) {
    await knex.schema.dropTableIfExists(table);
  }
}
