import "server-only";
import type { Farm } from "@/db/farms";
import { accountDateSpan, statementFields, statementPlantings, sumAccountDays, type StatementField } from "@/db/statement";
import { AppError } from "@/lib/api/errors";
import type { StatementSelection } from "@/lib/validation/statement";
import { addDaysIso } from "@/lib/waterbalance";
import { allocationUse } from "./allocation";
import { monthsOf, waterYearLabel, waterYearOf, waterYearPeriod, type Period } from "./period";
import { productivityOf } from "./productivity";
import { totalsOf, volumeM3, type AccountSums } from "./totals";
import type { Statement, StatementChoices, StatementPeriod } from "./types";

/** The water years with account days (and the current one), newest first; the seasons by name. */
async function choicesOf(farm: Farm, fields: StatementField[], today: string): Promise<StatementChoices> {
  const span = await accountDateSpan(farm.id);
  const current = waterYearOf(today, farm.waterYearStartMonth);
  const first = span ? Math.min(waterYearOf(span.first, farm.waterYearStartMonth), current) : current;
  const last = span ? Math.max(waterYearOf(span.last, farm.waterYearStartMonth), current) : current;
  const waterYears = [];
  for (let y = last; y >= first; y--) waterYears.push({ year: y, label: waterYearLabel(y, farm.waterYearStartMonth) });
  const bySeason = new Map<string, { season: string; from: string; to: string | null }>();
  for (const p of await statementPlantings(farm.id)) {
    const s = bySeason.get(p.season);
    if (!s) bySeason.set(p.season, { season: p.season, from: p.plantingDate, to: p.endDate });
    else {
      if (p.plantingDate < s.from) s.from = p.plantingDate;
      s.to = s.to === null || p.endDate === null ? null : p.endDate > s.to ? p.endDate : s.to;
    }
  }
  const seasons = [...bySeason.values()].sort((a, b) => b.from.localeCompare(a.from));
  return { fields: fields.map((f) => ({ id: f.id, name: f.name, areaHa: f.areaHa, archived: f.archived })), waterYears, seasons };
}

/**
 * The season statement of a farm or one of its fields, from its stored account days.
 * @param today the farm's local date; the account holds days up to yesterday
 */
export async function buildStatement(farm: Farm, selection: StatementSelection, today: string): Promise<Statement> {
  const fields = await statementFields(farm.id);
  const field = selection.fieldId ? fields.find((f) => f.id === selection.fieldId) : undefined;
  if (selection.fieldId && !field) throw new AppError("not_found", "That field is not on this farm.", { fieldId: "No such field on this farm" });
  const areas = new Map(fields.map((f) => [f.id, f.areaHa]));
  const startMonth = farm.waterYearStartMonth;

  let period: StatementPeriod;
  let plantingIds: string[] | undefined;
  if (selection.season !== undefined) {
    const plantings = await statementPlantings(farm.id, { season: selection.season, fieldId: selection.fieldId });
    if (plantings.length === 0) {
      throw new AppError("not_found", `No planting of the season "${selection.season}"${field ? ` on ${field.name}` : ""}.`, { season: "No planting of that season" });
    }
    const yesterday = addDaysIso(today, -1);
    const from = plantings.reduce((m, p) => (p.plantingDate < m ? p.plantingDate : m), plantings[0]!.plantingDate);
    const to = plantings.reduce((m, p) => {
      const end = p.endDate === null || p.endDate > yesterday ? yesterday : p.endDate;
      return end > m ? end : m;
    }, from);
    period = { kind: "season", season: selection.season, from, to };
    plantingIds = plantings.map((p) => p.id);
  } else {
    const year = selection.waterYear ?? waterYearOf(today, startMonth);
    period = { kind: "water-year", year, label: waterYearLabel(year, startMonth), ...waterYearPeriod(year, startMonth) };
  }

  const span: Period = { from: period.from, to: period.to };
  const rows = await sumAccountDays(farm.id, { ...span, fieldId: selection.fieldId, plantingIds });
  const totals = totalsOf(rows, areas);
  const months = monthsOf(span).map((month) => {
    const t = totalsOf(
      rows.filter((r) => r.month === month),
      areas,
    );
    return { month, fieldDays: t.fieldDays, lines: t.lines };
  });
  const shown = field ? [field] : fields;
  const fieldTotals = shown
    .map((f) => ({ fieldId: f.id, name: f.name, fieldAreaHa: f.areaHa, ...totalsOf(rows.filter((r) => r.fieldId === f.id), areas) }))
    .filter((t) => t.fieldDays > 0 || !fields.find((f) => f.id === t.fieldId)?.archived);

  // The licence is the farm's and runs by water year: whole-farm gross irrigation in the year the period starts.
  const wyYear = period.kind === "water-year" ? period.year : waterYearOf(period.from, startMonth);
  const wy = waterYearPeriod(wyYear, startMonth);
  const wyRows: AccountSums[] = period.kind === "water-year" && !selection.fieldId ? rows : await sumAccountDays(farm.id, wy);
  const useByMonth = new Map<string, number>();
  for (const r of wyRows) useByMonth.set(r.month, (useByMonth.get(r.month) ?? 0) + volumeM3(r.irrigationGrossMm, areas.get(r.fieldId) ?? 0));
  const allocation = {
    waterYear: wyYear,
    label: waterYearLabel(wyYear, startMonth),
    ...wy,
    ...allocationUse(monthsOf(wy), useByMonth, farm.allocationMl, farm.carryoverMl),
  };

  const ids = [...new Set(rows.map((r) => r.plantingId).filter((id): id is string => id !== null))];
  const plantings = ids.length > 0 ? await statementPlantings(farm.id, { ids }) : [];
  const productivity = plantings.map((p) => {
    const own = rows.filter((r) => r.plantingId === p.id);
    const area = areas.get(p.fieldId) ?? 0;
    return productivityOf({
      plantingId: p.id,
      fieldId: p.fieldId,
      fieldName: fields.find((f) => f.id === p.fieldId)?.name ?? "",
      cropName: p.cropName,
      season: p.season,
      areaHa: area,
      yieldTHa: p.yieldTHa,
      irrigationGrossM3: own.reduce((s, r) => s + volumeM3(r.irrigationGrossMm, area), 0),
      etActualM3: own.reduce((s, r) => s + volumeM3(r.etActualMm, area), 0),
    });
  });

  return {
    farm: { id: farm.id, name: farm.name, waterYearStartMonth: startMonth },
    field: field ? { id: field.id, name: field.name, areaHa: field.areaHa } : null,
    period,
    madeOn: today,
    totals,
    fields: fieldTotals,
    months,
    allocation,
    productivity,
    choices: await choicesOf(farm, fields, today),
    estimate: true,
  };
}
