/**
 * The harvested yield of a planting (t/ha, as the grower weighs it), so the season statement can give
 * water productivity. Nullable: most plantings have no yield until harvest, some never get one.
 */
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("plantings", (t) => {
    t.double("yield_t_ha").nullable();
    // Sugarcane and fresh vegetables reach a few hundred t/ha; a thousand is a typing slip.
    t.check("yield_t_ha >= 0 and yield_t_ha <= 1000", [], "plantings_yield_check");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("plantings", (t) => {
    // Dropping the column drops its check with it.
    t.dropColumn("yield_t_ha");
  });
}
