import "server-only";
import type { Knex } from "knex";
import type { FlagCandidate, FlagEntity } from "@/lib/qc/rules";
import { audit } from "./audit";
import { db } from "./knex";

export type FlagStatus = "open" | "accepted" | "overridden";

export interface QcFlag {
  id: string;
  farmId: string;
  entity: FlagEntity;
  entityId: string;
  date: string;
  rule: string;
  message: string;
  status: FlagStatus;
  reason: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
  createdAt: string;
}

interface QcFlagRow {
  id: string;
  farm_id: string;
  entity: FlagEntity;
  entity_id: string;
  date: string;
  rule: string;
  message: string;
  status: FlagStatus;
  reason: string | null;
  decided_by: string | null;
  decided_at: Date | null;
  created_at: Date;
}

export function toQcFlag(r: QcFlagRow): QcFlag {
  return {
    id: r.id,
    farmId: r.farm_id,
    entity: r.entity,
    entityId: r.entity_id,
    date: r.date,
    rule: r.rule,
    message: r.message,
    status: r.status,
    reason: r.reason,
    decidedBy: r.decided_by,
    decidedAt: r.decided_at ? r.decided_at.toISOString() : null,
    createdAt: r.created_at.toISOString(),
  };
}

const TABLES: Record<FlagEntity, string> = {
  rain_reading: "rain_readings",
  rain_record: "rain_records",
  weather_day: "weather_days",
};

/** What QC looks at on a farm between two dates (rain records a day either side, for account days). */
export async function loadQcInputs(farmId: string, fromDate: string, toDate: string) {
  const farm = (await db("farms")
    .where({ id: farmId })
    .first("time_zone", "rain_day_boundary_hour", "latitude", "elevation_m")) as
    | {
        time_zone: string;
        rain_day_boundary_hour: number;
        latitude: number | null;
        elevation_m: number | null;
      }
    | undefined;
  if (!farm) throw new Error(`farm ${farmId} not found`);
  const gauges = (await db("gauges")
    .where({ farm_id: farmId })
    .select("id", "kind", "latitude", "longitude", "resolution_mm")) as {
    id: string;
    kind: "manual" | "recording";
    latitude: number | null;
    longitude: number | null;
    resolution_mm: number | null;
  }[];
  const gaugeIds = gauges.map((g) => g.id);
  const readings = (await db("rain_readings")
    .whereIn("gauge_id", gaugeIds)
    .whereBetween("rain_date", [fromDate, toDate])
    .select("id", "gauge_id", "rain_date", "depth_mm")) as {
    id: string;
    gauge_id: string;
    rain_date: string;
    depth_mm: number;
  }[];
  const records = (await db("rain_records")
    .whereIn("gauge_id", gaugeIds)
    .where("at", ">=", db.raw("?::date - interval '1 day'", [fromDate]))
    .where("at", "<", db.raw("?::date + interval '3 day'", [toDate]))
    .orderBy(["gauge_id", "at"])
    .select("id", "gauge_id", "at", "depth_mm", "interval_s")) as {
    id: number;
    gauge_id: string;
    at: Date;
    depth_mm: number;
    interval_s: number | null;
  }[];
  const weather = (await db("weather_days as w")
    .join("weather_stations as s", "s.id", "w.station_id")
    .where("s.farm_id", farmId)
    .where("w.kind", "observed")
    .whereBetween("w.date", [fromDate, toDate])
    .select(
      "w.id",
      "w.date",
      "w.tmax_c",
      "w.tmin_c",
      "w.rh_max_pct",
      "w.rh_min_pct",
      "w.wind_ms",
      "w.solar_mj_m2",
      "w.rain_mm",
      db.raw("coalesce(s.latitude, ?) as latitude", [farm.latitude]),
      db.raw("coalesce(s.elevation_m, ?) as elevation_m", [farm.elevation_m]),
    )) as {
    id: string;
    date: string;
    tmax_c: number | null;
    tmin_c: number | null;
    rh_max_pct: number | null;
    rh_min_pct: number | null;
    wind_ms: number | null;
    solar_mj_m2: number | null;
    rain_mm: number | null;
    latitude: number | null;
    elevation_m: number | null;
  }[];
  return { farm, gauges, readings, records, weather };
}

async function flagColumns(
  trx: Knex.Transaction,
  entity: FlagEntity,
  ids: readonly string[],
): Promise<number> {
  let changed = 0;
  for (let i = 0; i < ids.length; i += 1000) {
    const chunk = ids.slice(i, i + 1000);
    const flags = (await trx("qc_flags")
      .where({ entity })
      .whereIn("entity_id", chunk)
      .whereNot({ status: "accepted" })
      .orderBy("rule")
      .select("entity_id", "message", "status", "reason")) as {
      entity_id: string;
      message: string;
      status: FlagStatus;
      reason: string | null;
    }[];
    const reasons = new Map<string, string[]>();
    for (const f of flags) {
      const text = f.status === "overridden" ? `set aside: ${f.reason ?? ""} (${f.message})` : f.message;
      reasons.set(f.entity_id, [...(reasons.get(f.entity_id) ?? []), text]);
    }
    const current = (await trx(TABLES[entity])
      .whereIn("id", chunk)
      .select("id", "flagged", "flag_reason")) as {
      id: string | number;
      flagged: boolean;
      flag_reason: string | null;
    }[];
    for (const row of current) {
      const list = reasons.get(String(row.id));
      const reason = list ? list.join("; ") : null;
      if (row.flagged === Boolean(list) && row.flag_reason === reason) continue;
      await trx(TABLES[entity])
        .where({ id: row.id })
        .update({ flagged: Boolean(list), flag_reason: reason });
      changed += 1;
    }
  }
  return changed;
}

/**
 * Stores what the rules found between two dates: new flags open, flags still found stay as decided,
 * open flags no longer found (the value was corrected) go away; then the flagged / flag_reason columns
 * of every row with a flag, or that just lost one, follow its flags (flagged while any flag is open or
 * overridden). Rows quality control has never flagged keep what a person or logger set on them.
 */
export async function syncFlags(
  farmId: string,
  fromDate: string,
  toDate: string,
  candidates: readonly FlagCandidate[],
): Promise<{ opened: number; closed: number; rowsChanged: number }> {
  return db.transaction(async (trx) => {
    const key = (f: { entity: string; entityId: string; rule: string }) =>
      `${f.entity}|${f.entityId}|${f.rule}`;
    const wanted = new Map(candidates.map((c) => [key(c), c]));
    const existing = (await trx("qc_flags")
      .where({ farm_id: farmId })
      .whereBetween("date", [fromDate, toDate])
      .select("id", "entity", "entity_id", "rule", "status")) as {
      id: string;
      entity: FlagEntity;
      entity_id: string;
      rule: string;
      status: FlagStatus;
    }[];
    const stale = existing.filter(
      (f) =>
        f.status === "open" && !wanted.has(key({ entity: f.entity, entityId: f.entity_id, rule: f.rule })),
    );
    if (stale.length > 0)
      await trx("qc_flags")
        .whereIn(
          "id",
          stale.map((f) => f.id),
        )
        .delete();
    let opened = 0;
    const list = [...wanted.values()];
    for (let i = 0; i < list.length; i += 500) {
      const rows = list.slice(i, i + 500).map((c) => ({
        farm_id: farmId,
        entity: c.entity,
        entity_id: c.entityId,
        date: c.date,
        rule: c.rule,
        message: c.message,
      }));
      const inserted = (await trx("qc_flags")
        .insert(rows)
        .onConflict(["entity", "entity_id", "rule"])
        .ignore()
        .returning("id")) as { id: string }[];
      opened += inserted.length;
    }
    const touched: Record<FlagEntity, Set<string>> = {
      rain_reading: new Set(),
      rain_record: new Set(),
      weather_day: new Set(),
    };
    for (const f of existing) touched[f.entity].add(f.entity_id);
    for (const c of candidates) touched[c.entity].add(c.entityId);
    let rowsChanged = 0;
    for (const entity of Object.keys(TABLES) as FlagEntity[])
      rowsChanged += await flagColumns(trx, entity, [...touched[entity]]);
    return { opened, closed: stale.length, rowsChanged };
  });
}

export async function listFlags(
  farmId: string,
  filter: { status?: FlagStatus; from?: string; to?: string },
  page: { limit: number; offset: number },
) {
  const base = db("qc_flags").where({ farm_id: farmId });
  if (filter.status) base.where({ status: filter.status });
  if (filter.from) base.where("date", ">=", filter.from);
  if (filter.to) base.where("date", "<=", filter.to);
  const rows = (await base
    .clone()
    .orderBy([{ column: "date", order: "desc" }, { column: "rule" }, { column: "id" }])
    .limit(page.limit)
    .offset(page.offset)
    .select("*")) as QcFlagRow[];
  const [count] = (await base.clone().count<{ n: string }[]>({ n: "*" })) as { n: string }[];
  return { rows: rows.map(toQcFlag), total: Number(count?.n ?? 0) };
}

/**
 * A person's decision on a flag: accepted (the value counts) or overridden (set aside, with a reason).
 * Audited with the flag before and after; the row's flag columns follow in the same transaction.
 */
export async function decideFlag(
  farmId: string,
  flagId: string,
  decision: { status: "accepted" | "overridden"; reason: string | null },
  userId: string,
  onChanged: (trx: Knex.Transaction, flag: QcFlag) => Promise<void>,
): Promise<QcFlag | undefined> {
  return db.transaction(async (trx) => {
    const before = (await trx("qc_flags").where({ farm_id: farmId, id: flagId }).forUpdate().first()) as
      QcFlagRow | undefined;
    if (!before) return undefined;
    const [row] = (await trx("qc_flags")
      .where({ id: flagId })
      .update({
        status: decision.status,
        reason: decision.reason,
        decided_by: userId,
        decided_at: trx.fn.now(),
      })
      .returning("*")) as QcFlagRow[];
    const after = toQcFlag(row as QcFlagRow);
    const old = toQcFlag(before);
    await audit(
      {
        farmId,
        userId,
        action: "qc.decide",
        entity: "qc_flag",
        entityId: flagId,
        before: { status: old.status, reason: old.reason },
        after: { status: after.status, reason: after.reason },
        reason: decision.reason,
      },
      trx,
    );
    await flagColumns(trx, after.entity, [after.entityId]);
    await onChanged(trx, after);
    return after;
  });
}
