/**
 * v1, part 6: soils name their texture by the engine's texture ids (lib/waterbalance/soils.ts), so a soil
 * row always resolves to published defaults; crops may name their cover for the curve-number table
 * (NEH Part 630 ch. 9 / TR-55 Table 2-2b), from which the engine picks a curve number by soil group.
 * The lists are copied, not imported: an applied migration must not change when the engine does.
 */
import type { Knex } from "knex";
import { inList } from "./support/v1";

const TEXTURE_IDS = [
  "sand",
  "loamy-sand",
  "sandy-loam",
  "loam",
  "silt-loam",
  "silt",
  "sandy-clay-loam",
  "clay-loam",
  "silty-clay-loam",
  "sandy-clay",
  "silty-clay",
  "clay",
];

const RUNOFF_COVERS = [
  "fallow-bare",
  "row-crop-straight-poor",
  "row-crop-straight-good",
  "row-crop-contoured-good",
  "small-grain-straight-good",
  "legume-rotation-straight-good",
  "pasture-good",
  "pasture-fair",
  "pasture-poor",
];

export async function up(knex: Knex): Promise<void> {
  // Rows written before this migration used words ('sandy loam'); the ids are the same words hyphenated.
  await knex.raw("update soils set texture = replace(lower(btrim(texture)), ' ', '-')");
  await knex.schema.alterTable("soils", (t) => {
    t.check(inList("texture", TEXTURE_IDS), [], "soils_texture_check");
  });
  await knex.schema.alterTable("crops", (t) => {
    t.text("runoff_cover").nullable();
    t.check(inList("runoff_cover", RUNOFF_COVERS), [], "crops_runoff_cover_check");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("crops", (t) => {
    t.dropChecks(["crops_runoff_cover_check"]);
    t.dropColumn("runoff_cover");
  });
  await knex.schema.alterTable("soils", (t) => {
    t.dropChecks(["soils_texture_check"]);
  });
}
