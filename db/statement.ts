import "server-only";
import type { AccountSums } from "@/lib/statement/totals";
import { db } from "./knex";

/** The reads of the season statement: account days summed by the database, fields and plantings. */

export interface StatementField {
  id: string;
  name: string;
  areaHa: number;
  archived: boolean;
}

export interface StatementPlanting {
  id: string;
  fieldId: string;
  season: string;
  cropName: string;
  plantingDate: string;
  endDate: string | null;
  yieldTHa: number | null;
}

/** Every field of the farm, archived ones too: water they used still counts against the licence. */
export async function statementFields(farmId: string): Promise<StatementField[]> {
  const rows = (await db("fields").where({ farm_id: farmId }).orderBy(["name", "id"]).select("id", "name", "area_ha", "archived_at")) as {
    id: string;
    name: string;
    area_ha: number;
    archived_at: Date | null;
  }[];
  return rows.map((r) => ({ id: r.id, name: r.name, areaHa: Number(r.area_ha), archived: r.archived_at !== null }));
}

interface SumRow {
  field_id: string;
  planting_id: string | null;
  month: string;
  days: number;
  last_date: string;
  rain_mm: number;
  runoff_mm: number;
  effective_rain_mm: number;
  irrigation_gross_mm: number;
  irrigation_net_mm: number;
  capillary_rise_mm: number;
  etc_mm: number;
  et_actual_mm: number;
  deep_percolation_mm: number;
  storage_change_mm: number;
}

function toAccountSums(r: SumRow): AccountSums {
  return {
    fieldId: r.field_id,
    plantingId: r.planting_id,
    month: r.month,
    days: Number(r.days),
    lastDate: r.last_date,
    rainMm: Number(r.rain_mm),
    runoffMm: Number(r.runoff_mm),
    effectiveRainMm: Number(r.effective_rain_mm),
    irrigationGrossMm: Number(r.irrigation_gross_mm),
    irrigationNetMm: Number(r.irrigation_net_mm),
    capillaryRiseMm: Number(r.capillary_rise_mm),
    etcMm: Number(r.etc_mm),
    etActualMm: Number(r.et_actual_mm),
    deepPercolationMm: Number(r.deep_percolation_mm),
    storageChangeMm: Number(r.storage_change_mm),
  };
}

const SUMMED = ["rain_mm", "runoff_mm", "effective_rain_mm", "irrigation_gross_mm", "irrigation_net_mm", "capillary_rise_mm", "etc_mm", "et_actual_mm", "deep_percolation_mm"];

/**
 * The farm's stored account days from `from` to `to` (both included), summed per field, planting and
 * month; optionally one field's only, or only the days of some plantings. A missing term counts 0.
 */
export async function sumAccountDays(
  farmId: string,
  filter: { from: string; to: string; fieldId?: string; plantingIds?: readonly string[] },
): Promise<AccountSums[]> {
  const rows = (await db("account_days as a")
    .join("fields as f", "f.id", "a.field_id")
    .where("f.farm_id", farmId)
    .whereBetween("a.date", [filter.from, filter.to])
    .modify((q) => {
      if (filter.fieldId) q.where("a.field_id", filter.fieldId);
      if (filter.plantingIds) q.whereIn("a.planting_id", filter.plantingIds);
    })
    .groupBy("a.field_id", "a.planting_id", db.raw("to_char(a.date, 'YYYY-MM')"))
    .orderBy([{ column: "month" }, { column: "a.field_id" }])
    .select(
      "a.field_id",
      "a.planting_id",
      db.raw("to_char(a.date, 'YYYY-MM') as month"),
      db.raw("count(*)::int as days"),
      db.raw("max(a.date) as last_date"),
      ...SUMMED.map((c) => db.raw(`coalesce(sum(a.${c}), 0)::float8 as ${c}`)),
      db.raw("sum(a.depletion_start_mm - a.depletion_end_mm)::float8 as storage_change_mm"),
    )) as SumRow[];
  return rows.map(toAccountSums);
}

interface PlantingRow {
  id: string;
  field_id: string;
  season: string;
  crop_name: string;
  planting_date: string;
  end_date: string | null;
  yield_t_ha: number | null;
}

function plantingsQuery(farmId: string) {
  return db("plantings as p")
    .join("fields as f", "f.id", "p.field_id")
    .join("crops as c", "c.id", "p.crop_id")
    .where("f.farm_id", farmId)
    .orderBy([{ column: "p.planting_date" }, { column: "p.id" }])
    .select("p.id", "p.field_id", "p.season", "c.name as crop_name", "p.planting_date", "p.end_date", "p.yield_t_ha");
}

function toStatementPlanting(r: PlantingRow): StatementPlanting {
  return {
    id: r.id,
    fieldId: r.field_id,
    season: r.season,
    cropName: r.crop_name,
    plantingDate: r.planting_date,
    endDate: r.end_date,
    yieldTHa: r.yield_t_ha === null ? null : Number(r.yield_t_ha),
  };
}

/** The farm's plantings, all of them or those of one season's name (and one field). */
export async function statementPlantings(farmId: string, filter: { season?: string; fieldId?: string; ids?: readonly string[] } = {}): Promise<StatementPlanting[]> {
  const rows = (await plantingsQuery(farmId).modify((q) => {
    if (filter.season !== undefined) q.where("p.season", filter.season);
    if (filter.fieldId) q.where("p.field_id", filter.fieldId);
    if (filter.ids) q.whereIn("p.id", filter.ids);
  })) as PlantingRow[];
  return rows.map(toStatementPlanting);
}

/** First and last day of the farm's stored account, or null when it has none yet. */
export async function accountDateSpan(farmId: string): Promise<{ first: string; last: string } | null> {
  const row = (await db("account_days as a")
    .join("fields as f", "f.id", "a.field_id")
    .where("f.farm_id", farmId)
    .first(db.raw("min(a.date) as first"), db.raw("max(a.date) as last"))) as { first: string | null; last: string | null } | undefined;
  return row?.first && row.last ? { first: row.first, last: row.last } : null;
}

/** The e-mail address of a member of the farm, or undefined when no member has it. */
export async function memberEmail(farmId: string, email: string): Promise<string | undefined> {
  const row = (await db("memberships as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.farm_id", farmId)
    .whereRaw("lower(u.email) = lower(?)", [email])
    .first("u.email")) as { email: string } | undefined;
  return row?.email;
}
