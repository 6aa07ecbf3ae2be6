import "server-only";
import { db } from "./knex";

export interface FieldSummary {
  id: string;
  name: string;
  areaHa: number;
  soilName: string | null;
  cropName: string | null;
  systemName: string | null;
}

/** The farm's fields with their soil, current crop and irrigation system, by name. */
export async function listFieldSummaries(farmId: string, onDate: string): Promise<FieldSummary[]> {
  const rows = await db("fields as f")
    .leftJoin("soils as s", "s.id", "f.soil_id")
    .leftJoin("irrigation_systems as sys", "sys.id", "f.irrigation_system_id")
    .leftJoin("plantings as p", function () {
      this.on("p.field_id", "f.id")
        .andOn("p.planting_date", "<=", db.raw("?::date", [onDate]))
        .andOn(db.raw("coalesce(p.end_date, 'infinity'::date) >= ?::date", [onDate]));
    })
    .leftJoin("crops as c", "c.id", "p.crop_id")
    .where("f.farm_id", farmId)
    .whereNull("f.archived_at")
    .orderBy("f.name")
    .select("f.id", "f.name", "f.area_ha", "s.name as soil_name", "c.name as crop_name", "sys.name as system_name");
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    areaHa: Number(r.area_ha),
    soilName: r.soil_name,
    cropName: r.crop_name,
    systemName: r.system_name,
  }));
}
