/**
 * A planting's Kc scale: the factor a calibration against the field's soil checks found, multiplying
 * the planting's Kc ini, mid and end (before the FAO-56 eq. 62 climate adjustment). Null = not scaled.
 */
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("plantings", (t) => {
    t.double("kc_scale").nullable();
    // Beyond half or double the published curve the crop, not its coefficient, is probably wrong.
    t.check("kc_scale between 0.5 and 2", [], "plantings_kc_scale_check");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("plantings", (t) => {
    t.dropChecks(["plantings_kc_scale_check"]);
    t.dropColumn("kc_scale");
  });
}
