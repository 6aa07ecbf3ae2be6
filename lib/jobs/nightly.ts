import "server-only";
import { TZDate } from "@date-fns/tz";
import { db } from "@/db/knex";
import { markFieldsDirty } from "@/lib/accounts/dirty";
import { farmOutlooks, type FieldOutlook } from "@/lib/accounts/outlook";
import { recomputeFarm, type RecomputeResult } from "@/lib/accounts/recompute";
import { farmStatus } from "@/lib/accounts/status";
import { farmToday } from "@/lib/farm-time";
import type { ForecastProvider } from "@/lib/forecast/provider";
import { refreshForecast, type RefreshResult } from "@/lib/forecast/refresh";
import { addDaysIso } from "@/lib/waterbalance";
import { runAlerts } from "./alerts";
import { checkDirtyDays } from "./recompute";
import { JOBS, queue } from "./queue";

/**
 * The night's work per farm, at about 02:00 in the farm's own time zone (after the day's last manual
 * readings are in, before the morning's decisions): refresh the forecast, add the day just ended to every
 * account (after quality control of the stale days), refresh the outlook, then hand over to the alerts.
 */

/** Local hour the nightly run starts at. */
export const NIGHTLY_LOCAL_HOUR = 2;
/** Days the nightly outlook looks ahead. */
export const NIGHTLY_OUTLOOK_DAYS = 7;

/** Farms whose local hour is `hour` at `now` (an hourly tick picks each farm once a night). */
export async function farmsAtLocalHour(hour: number, now: Date = new Date()): Promise<string[]> {
  const farms = (await db("farms").select("id", "time_zone")) as { id: string; time_zone: string }[];
  return farms.filter((f) => new TZDate(now.getTime(), f.time_zone).getHours() === hour).map((f) => f.id);
}

/** The hourly tick: queues one nightly job for each farm whose night it is. */
export async function runNightlyTick(now: Date = new Date()): Promise<string[]> {
  const farmIds = await farmsAtLocalHour(NIGHTLY_LOCAL_HOUR, now);
  const boss = await queue();
  for (const farmId of farmIds) await boss.send(JOBS.nightly, { farmId }, { singletonKey: farmId, retryLimit: 2 });
  return farmIds;
}

export interface NightlyResult {
  /** the stored forecast, or why there is none tonight (no station, service down): the night goes on */
  forecast: RefreshResult | { error: string };
  recompute: RecomputeResult;
  outlooks: FieldOutlook[];
  alerts: AlertNote[];
}

/** One farm's night: forecast, mark every field dirty from yesterday, quality control, recompute, outlook, alerts. */
export async function runNightly(farmId: string, today?: string, opts: { forecastProvider?: ForecastProvider } = {}): Promise<NightlyResult> {
  const farm = (await db("farms").where({ id: farmId }).first("time_zone")) as { time_zone: string } | undefined;
  if (!farm) throw new Error(`nightly: no farm ${farmId}`);
  const localToday = today ?? farmToday(farm.time_zone);
  const forecast = await refreshForecast(farmId, opts.forecastProvider ? { provider: opts.forecastProvider } : {}).catch((err: unknown) => {
    const error = err instanceof Error ? err.message : String(err);
    console.warn(`nightly ${farmId}: no forecast tonight: ${error}`);
    return { error };
  });
  await markFieldsDirty(db, { farmId }, addDaysIso(localToday, -1));
  await checkDirtyDays(farmId);
  const recompute = await recomputeFarm(farmId, { today: localToday });
  const outlooks = (await farmOutlooks(farmId, NIGHTLY_OUTLOOK_DAYS))?.outlooks ?? [];
  const alerts = await afterNightly(farmId, outlooks);
  await runAlerts(farmId);
  return { forecast, recompute, outlooks, alerts };
}

/** A field worth telling someone about after the night's run. */
export interface AlertNote {
  fieldId: string;
  name: string;
  kind: "stressed" | "due" | "due-soon";
  /** the outlook's first day at the trigger, for due-soon */
  triggerDate: string | null;
}

/**
 * Where alerts plug in. For now it works out which fields reached their trigger (or will within two days
 * by the outlook) and logs them; alert rules and notifications will take this list.
 */
export async function afterNightly(farmId: string, outlooks: readonly FieldOutlook[] = []): Promise<AlertNote[]> {
  const statuses = await farmStatus(farmId);
  const outlookOf = new Map(outlooks.map((o) => [o.fieldId, o]));
  const notes: AlertNote[] = [];
  for (const s of statuses) {
    if (s.band === "stressed" || s.band === "due") {
      notes.push({ fieldId: s.id, name: s.name, kind: s.band, triggerDate: null });
      continue;
    }
    const o = outlookOf.get(s.id);
    if (o?.daysUntilTrigger !== null && o?.daysUntilTrigger !== undefined && o.daysUntilTrigger <= 1) {
      notes.push({ fieldId: s.id, name: s.name, kind: "due-soon", triggerDate: o.triggerDate });
    }
  }
  if (notes.length) console.log(`nightly ${farmId}: ${notes.map((n) => `${n.name} ${n.kind}${n.triggerDate ? ` ${n.triggerDate}` : ""}`).join(", ")}`);
  return notes;
}
