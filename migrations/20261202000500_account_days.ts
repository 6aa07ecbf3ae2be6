/**
 * v1, part 5: the water account itself, one row per field per local day with every term of the FAO-56
 * ch. 8 balance. Rows are written only by the recompute job, so they carry no person attribution.
 */
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("account_days", (t) => {
    t.uuid("field_id").notNullable().references("id").inTable("fields").onDelete("CASCADE");
    t.date("date").notNullable();
    t.uuid("planting_id").nullable().references("id").inTable("plantings").onDelete("SET NULL");
    t.double("eto_mm").nullable();
    t.double("kc").nullable();
    t.double("etc_mm").nullable();
    t.double("ks").nullable();
    t.double("et_actual_mm").nullable();
    t.double("rain_mm").nullable();
    t.double("runoff_mm").nullable();
    t.double("effective_rain_mm").nullable();
    t.double("irrigation_gross_mm").nullable();
    t.double("irrigation_net_mm").nullable();
    t.double("capillary_rise_mm").nullable();
    t.double("deep_percolation_mm").nullable();
    t.double("depletion_start_mm").notNullable();
    t.double("depletion_end_mm").notNullable();
    t.double("taw_mm").nullable();
    t.double("raw_mm").nullable();
    t.double("p_adjusted").nullable();
    t.double("root_depth_m").nullable();
    t.boolean("soil_check_reset").notNullable().defaultTo(false);
    // Which inputs were measured and which estimated, which gauges and weights, which equations.
    t.jsonb("provenance").notNullable().defaultTo(knex.raw("'{}'::jsonb"));
    t.timestamp("computed_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["field_id", "date"]);
    t.index(["planting_id"]);
    // Flows into and out of the root zone are never negative; the sign lives in the balance equation.
    t.check(
      "eto_mm >= 0 and etc_mm >= 0 and et_actual_mm >= 0 and rain_mm >= 0 and runoff_mm >= 0 " +
        "and effective_rain_mm >= 0 and irrigation_gross_mm >= 0 and irrigation_net_mm >= 0 " +
        "and capillary_rise_mm >= 0 and deep_percolation_mm >= 0",
      [],
      "account_days_flows_check",
    );
    // Runoff and effective rain are both shares of the rain that fell.
    t.check(
      "runoff_mm <= rain_mm + 0.001 and effective_rain_mm <= rain_mm + 0.001",
      [],
      "account_days_rain_split_check",
    );
    // Depletion is measured down from field capacity, so it is never negative.
    t.check("depletion_start_mm >= 0 and depletion_end_mm >= 0", [], "account_days_depletion_check");
    t.check(
      "kc between 0 and 2 and ks between 0 and 1 and p_adjusted between 0 and 1",
      [],
      "account_days_coefficients_check",
    );
    t.check(
      "taw_mm >= 0 and raw_mm >= 0 and raw_mm <= taw_mm + 0.001 and root_depth_m > 0",
      [],
      "account_days_store_check",
    );
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("account_days");
}
