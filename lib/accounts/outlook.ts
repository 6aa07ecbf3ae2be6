import "server-only";
import { latestDaysOfFarm } from "@/db/accounts";
import { loadFarmObservations, loadFarmSetup, type AccountField, type FarmSetup } from "@/db/account-inputs";
import {
  addDaysIso,
  computeOutlook,
  planFarm,
  planFieldFromOutlook,
  referenceEtDaily,
  type ApplicationRate,
  type CapacityGroup,
  type FarmPlanResult,
  type OutlookResult,
  type PlanField,
} from "@/lib/waterbalance";
import { buildFarmContext, fieldSpec, nearestStationId, plantingSpec, systemEfficiency, type FarmInputContext } from "./inputs";

/** The account projected forward from its last stored day, per field and for the whole farm. */

/** Days of stored ETo averaged for days without a forecast (common practice, no source). */
export const RECENT_ETO_DAYS = 7;

export interface FieldOutlook extends OutlookResult {
  fieldId: string;
  /** the last stored account day the outlook starts after */
  lastAccountDate: string;
  systemId: string | null;
}

interface Latest {
  date: string;
  depletionEndMm: number;
  plantingId: string | null;
  recentEtoMm: number[];
}

/** Forecast ETo by day from `from` for `days` days at the field's station (NaN where there is none). */
function forecastFor(ctx: FarmInputContext, forecast: Map<string, Map<string, { etoMm: number; rainMm: number }>>, field: AccountField, from: string, days: number) {
  const stationId = nearestStationId(ctx, field, false);
  const byDate = stationId ? forecast.get(stationId) : undefined;
  const eto: number[] = [];
  const rain: number[] = [];
  for (let d = 0, date = from; d < days; d++, date = addDaysIso(date, 1)) {
    const f = byDate?.get(date);
    eto.push(f ? f.etoMm : NaN);
    rain.push(f ? f.rainMm : 0);
  }
  return { eto, rain };
}

/** Forecast weather days (ETo given, or FAO-56 Penman-Monteith from what the forecast has) by station. */
async function loadForecast(setup: FarmSetup, from: string, to: string): Promise<Map<string, Map<string, { etoMm: number; rainMm: number }>>> {
  const obs = await loadFarmObservations({ ...setup, gauges: [] }, [], { from, to });
  const ctx = buildFarmContext({ ...setup, gauges: [] }, { ...obs, weather: [] });
  const out = new Map<string, Map<string, { etoMm: number; rainMm: number }>>();
  for (const w of obs.weather) {
    if (w.kind !== "forecast" || (w.flagged && !setup.farm.countFlaggedValues)) continue;
    let eto = w.etoMm;
    const site = ctx.sites.get(w.stationId);
    if (eto === null && w.tmaxC !== null && w.tminC !== null && site) {
      eto = referenceEtDaily(
        {
          date: w.date,
          tMaxC: w.tmaxC,
          tMinC: w.tminC,
          ...(w.rhMaxPct !== null ? { rhMaxPct: w.rhMaxPct } : {}),
          ...(w.rhMinPct !== null ? { rhMinPct: w.rhMinPct } : {}),
          ...(w.windMs !== null ? { windMs: w.windMs } : {}),
          ...(w.solarMJm2 !== null ? { solarMJm2: w.solarMJm2 } : {}),
        },
        site,
      ).etoMm;
    }
    if (eto === null) continue;
    let byDate = out.get(w.stationId);
    if (!byDate) out.set(w.stationId, (byDate = new Map()));
    byDate.set(w.date, { etoMm: eto, rainMm: w.rainMm ?? 0 });
  }
  return out;
}

function applicationOf(ctx: FarmInputContext, field: AccountField): ApplicationRate | undefined {
  const sys = field.systemId ? ctx.systems.get(field.systemId) : undefined;
  return sys?.flowM3H ? { kind: "flow", flowRateM3H: sys.flowM3H } : undefined;
}

function outlookOf(
  ctx: FarmInputContext,
  forecast: Map<string, Map<string, { etoMm: number; rainMm: number }>>,
  field: AccountField,
  latest: Latest,
  days: number,
  countForecastRain: number,
): FieldOutlook | null {
  const planting = ctx.setup.plantings.find((p) => p.id === latest.plantingId);
  if (!planting) return null;
  const spec = fieldSpec(field, planting);
  if (!spec) return null;
  const from = addDaysIso(latest.date, 1);
  const f = forecastFor(ctx, forecast, field, from, days);
  const application = applicationOf(ctx, field);
  const result = computeOutlook({
    field: spec,
    planting: plantingSpec(planting),
    system: { applicationEfficiency: systemEfficiency(ctx, field) },
    fromDate: from,
    startDepletionMm: latest.depletionEndMm,
    days,
    forecastEtoMm: f.eto,
    recentEtoMm: latest.recentEtoMm,
    forecastRainMm: f.rain,
    forecastRainDiscount: 1 - countForecastRain,
    ...(application ? { application } : {}),
  });
  return { ...result, fieldId: field.id, lastAccountDate: latest.date, systemId: field.systemId };
}

/** Loads what the outlooks of a farm's fields need, once. */
async function outlookContext(farmId: string, which: "all" | { fieldIds: readonly string[] }, days: number) {
  const setup = await loadFarmSetup(farmId, which);
  if (!setup) return null;
  const latest = await latestDaysOfFarm(farmId, RECENT_ETO_DAYS);
  let from: string | null = null;
  let to: string | null = null;
  for (const l of latest.values()) {
    const f = addDaysIso(l.date, 1);
    const t = addDaysIso(l.date, days);
    if (from === null || f < from) from = f;
    if (to === null || t > to) to = t;
  }
  const forecast = from && to ? await loadForecast(setup, from, to) : new Map();
  const ctx = buildFarmContext(setup, { weather: [], readings: [], records: [], irrigations: [], soilChecks: [] });
  return { setup, latest, forecast, ctx };
}

/**
 * A field's outlook: `days` days from the day after its last stored account day. Returns
 * 'no-field' when the field is not the farm's, 'no-account' when nothing is stored yet.
 */
export async function fieldOutlook(farmId: string, fieldId: string, days: number, countForecastRain = 0): Promise<FieldOutlook | "no-field" | "no-account"> {
  const loaded = await outlookContext(farmId, { fieldIds: [fieldId] }, days);
  const field = loaded?.setup.fields[0];
  if (!loaded || !field) return "no-field";
  const latest = loaded.latest.get(fieldId);
  if (!latest) return "no-account";
  return outlookOf(loaded.ctx, loaded.forecast, field, latest, days, countForecastRain) ?? "no-account";
}

/** Outlooks of every field of the farm with a stored account. */
export async function farmOutlooks(farmId: string, days: number, countForecastRain = 0): Promise<{ setup: FarmSetup; outlooks: FieldOutlook[] } | null> {
  const loaded = await outlookContext(farmId, "all", days);
  if (!loaded) return null;
  const outlooks: FieldOutlook[] = [];
  for (const field of loaded.setup.fields) {
    const latest = loaded.latest.get(field.id);
    if (!latest) continue;
    const o = outlookOf(loaded.ctx, loaded.forecast, field, latest, days, countForecastRain);
    if (o) outlooks.push(o);
  }
  return { setup: loaded.setup, outlooks };
}

/** Hours a system (or the pump it shares) may run in a day when planning (common practice, no source). */
export const PLAN_HOURS_PER_DAY = 24;

/**
 * Shared capacity: systems naming the same pump share one limit (the largest of their daily volumes,
 * since one pump runs one set at a time); a system on its own pump is its own limit. Daily volume is
 * flow x hours, else design capacity (mm/day) over the area of the fields it serves.
 */
export function capacityGroups(setup: FarmSetup): { groups: CapacityGroup[]; groupOfSystem: Map<string, string> } {
  const areaBySystem = new Map<string, number>();
  for (const f of setup.fields) if (f.systemId) areaBySystem.set(f.systemId, (areaBySystem.get(f.systemId) ?? 0) + f.areaHa);
  const byGroup = new Map<string, number>();
  const groupOfSystem = new Map<string, string>();
  for (const s of setup.systems) {
    const m3 = s.flowM3H ? s.flowM3H * PLAN_HOURS_PER_DAY : s.capacityMmDay && areaBySystem.get(s.id) ? s.capacityMmDay * areaBySystem.get(s.id)! * 10 : null;
    if (m3 === null) continue;
    const id = s.pumpName ? `pump:${s.pumpName}` : `system:${s.id}`;
    groupOfSystem.set(s.id, id);
    byGroup.set(id, Math.max(byGroup.get(id) ?? 0, m3));
  }
  return { groups: [...byGroup].map(([id, m3PerDay]) => ({ id, m3PerDay })), groupOfSystem };
}

/** The farm plan over `days` days: every field's next irrigation ordered by urgency within shared capacity. */
export async function farmPlan(farmId: string, startDate: string, days: number, countForecastRain = 0): Promise<(FarmPlanResult & { capacities: CapacityGroup[]; outlooks: FieldOutlook[] }) | null> {
  const loaded = await farmOutlooks(farmId, days, countForecastRain);
  if (!loaded) return null;
  const { groups, groupOfSystem } = capacityGroups(loaded.setup);
  const areaOf = new Map(loaded.setup.fields.map((f) => [f.id, f.areaHa]));
  const fields: PlanField[] = loaded.outlooks.map((o) => {
    const group = o.systemId ? groupOfSystem.get(o.systemId) : undefined;
    const pf = planFieldFromOutlook(o.fieldId, areaOf.get(o.fieldId) ?? 1, o, group ? [group] : []);
    // A field already past its trigger is due on the first day of the plan, not on a day behind it.
    return pf.dueDate !== null && pf.dueDate < startDate ? { ...pf, dueDate: startDate } : pf;
  });
  const plan = planFarm({ startDate, days, fields, capacities: groups });
  return { ...plan, capacities: groups, outlooks: loaded.outlooks };
}
