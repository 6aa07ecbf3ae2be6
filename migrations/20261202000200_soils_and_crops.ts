/**
 * v1, part 2: soils and crops. A row with farm_id null belongs to the published library every farm reads;
 * a farm's own rows are copies it may tune.
 */
import type { Knex } from "knex";
import { attribution, inList, timestamps, touchUpdatedAt, uuidId } from "./support/v1";

/** Names are unique within a farm, and within the library; a farm may reuse a library name for its copy. */
async function uniqueNamePerOwner(knex: Knex, table: string): Promise<void> {
  await knex.raw(`create unique index ?? on ?? (farm_id, name) where farm_id is not null`, [
    `${table}_farm_name_unique`,
    table,
  ]);
  await knex.raw(`create unique index ?? on ?? (name) where farm_id is null`, [
    `${table}_library_name_unique`,
    table,
  ]);
}

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("soils", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").nullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("texture").notNullable();
    t.double("theta_fc").notNullable();
    t.double("theta_wp").notNullable();
    t.double("theta_sat").notNullable();
    // Evaporation layer (FAO-56 ch. 7) and Green-Ampt inputs: nullable so the engine can fall back to
    // the texture's published values when a farm's soil leaves them out.
    t.double("rew_mm").nullable();
    t.double("tew_mm").nullable();
    t.double("ga_suction_mm").nullable();
    t.double("ga_ksat_mm_h").nullable();
    t.double("ga_porosity").nullable();
    t.double("ga_effective_porosity").nullable();
    t.text("hydrologic_group").nullable();
    t.text("source").nullable();
    t.text("note").nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["farm_id"]);
    t.check("length(btrim(name)) > 0 and length(btrim(texture)) > 0", [], "soils_names_check");
    // Water held at wilting point < at field capacity < at saturation, and no soil holds more than its volume.
    t.check(
      "0 < theta_wp and theta_wp < theta_fc and theta_fc < theta_sat and theta_sat <= 1",
      [],
      "soils_theta_check",
    );
    // Readily evaporable water is part of the total evaporable water (FAO-56 eq. 73-74).
    t.check(
      "rew_mm >= 0 and tew_mm > 0 and rew_mm <= tew_mm and tew_mm <= 100",
      [],
      "soils_evaporable_water_check",
    );
    t.check("ga_suction_mm > 0 and ga_suction_mm <= 2000", [], "soils_ga_suction_check");
    t.check("ga_ksat_mm_h > 0 and ga_ksat_mm_h <= 1000", [], "soils_ga_ksat_check");
    // The pores that take water in are some of all pores.
    t.check(
      "ga_porosity > 0 and ga_porosity <= 1 and ga_effective_porosity > 0 and ga_effective_porosity <= ga_porosity",
      [],
      "soils_ga_porosity_check",
    );
    t.check(inList("hydrologic_group", ["A", "B", "C", "D"]), [], "soils_hydrologic_group_check");
  });
  await touchUpdatedAt(knex, "soils");
  await uniqueNamePerOwner(knex, "soils");

  await knex.schema.createTable("crops", (t) => {
    uuidId(knex, t);
    t.uuid("farm_id").nullable().references("id").inTable("farms").onDelete("CASCADE");
    t.text("name").notNullable();
    t.double("kc_ini").notNullable();
    t.double("kc_mid").notNullable();
    t.double("kc_end").notNullable();
    // Basal coefficients (FAO-56 Table 17) for the dual-coefficient option; null = single Kc only.
    t.double("kcb_ini").nullable();
    t.double("kcb_mid").nullable();
    t.double("kcb_end").nullable();
    t.integer("stage_ini_days").notNullable();
    t.integer("stage_dev_days").notNullable();
    t.integer("stage_mid_days").notNullable();
    t.integer("stage_late_days").notNullable();
    t.double("height_m").nullable();
    t.double("root_min_m").notNullable();
    t.double("root_max_m").notNullable();
    t.double("p").notNullable();
    t.double("curve_number").nullable();
    t.text("source").nullable();
    t.text("note").nullable();
    attribution(t, { updated: true });
    timestamps(knex, t, { updated: true });
    t.index(["farm_id"]);
    t.check("length(btrim(name)) > 0", [], "crops_name_check");
    // No crop transpires twice the grass reference (FAO-56 Table 12 tops out near 1.2-1.4).
    t.check(
      "kc_ini between 0 and 2 and kc_mid between 0 and 2 and kc_end between 0 and 2",
      [],
      "crops_kc_check",
    );
    t.check(
      "kcb_ini between 0 and 2 and kcb_mid between 0 and 2 and kcb_end between 0 and 2",
      [],
      "crops_kcb_check",
    );
    t.check(
      "stage_ini_days >= 0 and stage_dev_days >= 0 and stage_mid_days >= 0 and stage_late_days >= 0 " +
        "and stage_ini_days + stage_dev_days + stage_mid_days + stage_late_days between 1 and 1000",
      [],
      "crops_stage_days_check",
    );
    t.check("height_m > 0 and height_m <= 30", [], "crops_height_check");
    // Roots start somewhere, only grow, and no field crop draws water from below ~5 m.
    t.check("root_min_m > 0 and root_min_m <= root_max_m and root_max_m <= 5", [], "crops_root_check");
    // Depletion fraction before stress: FAO-56 Table 22 spans about 0.2-0.75 (its ETc adjustment stays in 0.1-0.8).
    t.check("p between 0.05 and 0.95", [], "crops_p_check");
    t.check("curve_number between 30 and 100", [], "crops_curve_number_check");
  });
  await touchUpdatedAt(knex, "crops");
  await uniqueNamePerOwner(knex, "crops");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("crops");
  await knex.schema.dropTableIfExists("soils");
}
