import "server-only";
import { TZDate } from "@date-fns/tz";
import { db } from "@/db/knex";
import { farmPlan, farmOutlooks } from "@/lib/accounts/outlook";
import { farmStatus } from "@/lib/accounts/status";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";
import type { AlertKind } from "./rules";

/**
 * What holds on a farm right now that someone might want to hear about. Each condition names its subject
 * (a field, gauge, station or the farm) and the farm-local day it belongs to, so the same thing on the
 * same day is one alert however often the worker looks.
 */
export interface Condition {
  kind: AlertKind;
  subjectKey: string;
  fieldId: string | null;
  localDate: string;
  /** compared with a rule's threshold: days to the trigger, mm of rain, hours of silence */
  measure: number | null;
  title: string;
  body: string;
  url: string;
}

/** Hours after the rain-day boundary before a missing manual reading counts as missed (common practice, no source). */
export const READING_GRACE_HOURS = 3;
/** Days the outlook and the plan look ahead when alerts are evaluated (the longest outlook threshold). */
export const ALERT_OUTLOOK_DAYS = 14;

interface FarmRow {
  id: string;
  name: string;
  time_zone: string;
  rain_day_boundary_hour: number;
}

function localMidnight(isoDate: string, timeZone: string): Date {
  const [y, m, d] = isoDate.split("-").map(Number);
  return new Date(new TZDate(y ?? 1970, (m ?? 1) - 1, d ?? 1, timeZone).getTime());
}

const fmt = (mm: number) => `${Math.round(mm * 10) / 10} mm`;

async function fieldConditions(farm: FarmRow, today: string): Promise<Condition[]> {
  const out: Condition[] = [];
  const statuses = await farmStatus(farm.id);
  const fieldUrl = (id: string) => `/farms/${farm.id}/fields/${id}`;
  const dueIds = new Set<string>();
  for (const s of statuses) {
    if ((s.band === "due" || s.band === "stressed") && s.depletionMm !== null && s.triggerMm !== null) {
      dueIds.add(s.id);
      out.push({
        kind: "field-trigger",
        subjectKey: s.id,
        fieldId: s.id,
        localDate: today,
        measure: null,
        title: `${s.name} needs water`,
        body: `Depletion ${fmt(s.depletionMm)} is past the trigger of ${fmt(s.triggerMm)}${s.band === "stressed" ? ", beyond RAW: the crop is short of water" : ""}. An estimate: confirm with a field check.`,
        url: fieldUrl(s.id),
      });
    }
  }
  const outlooks = (await farmOutlooks(farm.id, ALERT_OUTLOOK_DAYS))?.outlooks ?? [];
  const names = new Map(statuses.map((s) => [s.id, s.name]));
  for (const o of outlooks) {
    if (dueIds.has(o.fieldId) || o.daysUntilTrigger === null || o.triggerDate === null) continue;
    const days = Math.max(1, o.daysUntilTrigger);
    out.push({
      kind: "outlook-trigger",
      subjectKey: o.fieldId,
      fieldId: o.fieldId,
      localDate: today,
      measure: days,
      title: `${names.get(o.fieldId) ?? "A field"} reaches its trigger by ${o.triggerDate}`,
      body: `The outlook puts the field at its trigger in ${days} day${days === 1 ? "" : "s"}. An estimate: confirm with a field check.`,
      url: fieldUrl(o.fieldId),
    });
  }
  // Rain on the account's last two days: enough of it means a planned set can wait or be shorter.
  const rain = (await db("account_days as a")
    .join("fields as f", "f.id", "a.field_id")
    .where("f.farm_id", farm.id)
    .whereNull("f.archived_at")
    .where("a.date", ">=", addDaysIso(today, -1))
    .where("a.rain_mm", ">", 0)
    .select("f.id", "f.name", "a.date", "a.rain_mm", "a.effective_rain_mm")) as { id: string; name: string; date: string; rain_mm: number; effective_rain_mm: number | null }[];
  for (const r of rain) {
    out.push({
      kind: "rain-skip",
      subjectKey: r.id,
      fieldId: r.id,
      localDate: r.date,
      measure: r.rain_mm,
      title: `${fmt(r.rain_mm)} of rain on ${r.name}`,
      body: `${fmt(r.rain_mm)} fell on ${r.date}${r.effective_rain_mm !== null ? ` (${fmt(r.effective_rain_mm)} effective rain)` : ""}: an irrigation may be skipped or shortened. Check the outlook before changing a set.`,
      url: fieldUrl(r.id),
    });
  }
  return out;
}

async function gaugeConditions(farm: FarmRow, now: Date): Promise<Condition[]> {
  const out: Condition[] = [];
  const local = new TZDate(now.getTime(), farm.time_zone);
  const today = farmToday(farm.time_zone, now);
  // A reading taken after the boundary on day D is booked to D-1 (see accountDayOfManualReading).
  const expected = addDaysIso(today, local.getHours() >= farm.rain_day_boundary_hour + READING_GRACE_HOURS ? -1 : -2);
  const missed = (await db("gauges as g")
    .where({ "g.farm_id": farm.id, "g.kind": "manual" })
    .whereNull("g.archived_at")
    .where("g.created_at", "<", localMidnight(expected, farm.time_zone))
    .whereNotExists(db("rain_readings as r").whereRaw("r.gauge_id = g.id").where("r.rain_date", expected))
    .select("g.id", "g.name")) as { id: string; name: string }[];
  for (const g of missed) {
    out.push({
      kind: "gauge-missed",
      subjectKey: g.id,
      fieldId: null,
      localDate: expected,
      measure: null,
      title: `No reading from ${g.name} for ${expected}`,
      body: `The manual gauge ${g.name} has no reading for the rain day ${expected}. Log it, even when it is dry, so the accounts count the right rain.`,
      url: `/farms/${farm.id}/log`,
    });
  }
  // Silence: the newest thing heard from each recording gauge (its records or its logger token) and station.
  const heard = (await db.raw(
    `select 'gauge' as what, g.id, g.name,
            greatest((select max(created_at) from rain_records where gauge_id = g.id),
                     (select max(last_used_at) from api_tokens where farm_id = g.farm_id and revoked_at is null and g.id = any(gauge_ids))) as last
       from gauges g where g.farm_id = ? and g.kind = 'recording' and g.archived_at is null
     union all
     select 'station', s.id, s.name,
            greatest((select max(created_at) from weather_days where station_id = s.id and kind = 'observed'),
                     (select max(last_used_at) from api_tokens where farm_id = s.farm_id and revoked_at is null and s.id = any(station_ids)))
       from weather_stations s where s.farm_id = ? and s.archived_at is null`,
    [farm.id, farm.id],
  )) as { rows: { what: "gauge" | "station"; id: string; name: string; last: Date | null }[] };
  for (const h of heard.rows) {
    if (!h.last) continue; // never heard from: being set up, not silent
    const hours = Math.floor((now.getTime() - h.last.getTime()) / 3_600_000);
    if (hours < 1) continue;
    out.push({
      kind: "sensor-silent",
      subjectKey: h.id,
      fieldId: null,
      localDate: today,
      measure: hours,
      title: `${h.name} has been silent for ${hours} h`,
      body: `Nothing from the ${h.what === "gauge" ? "recording gauge" : "weather station"} ${h.name} since ${h.last.toISOString().slice(0, 16).replace("T", " ")} UTC. Accounts estimate what it would have sent until it is back.`,
      url: `/farms/${farm.id}/setup`,
    });
  }
  return out;
}

async function planConditions(farm: FarmRow, today: string): Promise<Condition[]> {
  const plan = await farmPlan(farm.id, today, ALERT_OUTLOOK_DAYS);
  const first = plan?.shortfallDays[0];
  if (!first) return [];
  return [
    {
      kind: "capacity-shortfall",
      subjectKey: "farm",
      fieldId: null,
      localDate: today,
      measure: null,
      title: `The plan falls short of capacity from ${first.date}`,
      body: `${first.fieldIds.length} field(s) cannot be irrigated in time with the capacity there is (${Math.round(first.backlogM3)} m³ behind). Plans are estimates: check the plan and follow local water rules.`,
      url: `/farms/${farm.id}/plan`,
    },
  ];
}

/** Every condition that holds on the farm at `now`. */
export async function farmConditions(farmId: string, now: Date = new Date()): Promise<{ farm: { id: string; name: string; timeZone: string }; conditions: Condition[] } | null> {
  const farm = (await db("farms").where({ id: farmId }).first("id", "name", "time_zone", "rain_day_boundary_hour")) as FarmRow | undefined;
  if (!farm) return null;
  const today = farmToday(farm.time_zone, now);
  const conditions = [...(await fieldConditions(farm, today)), ...(await gaugeConditions(farm, now)), ...(await planConditions(farm, today))];
  return { farm: { id: farm.id, name: farm.name, timeZone: farm.time_zone }, conditions };
}
