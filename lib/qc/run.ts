import "server-only";
import { groupRecordsByAccountDay } from "@/lib/waterbalance";
import { loadQcInputs, syncFlags } from "@/db/qc";
import {
  neighbourFlags,
  readingRangeFlag,
  tipFlags,
  weatherDayFlags,
  type FlagCandidate,
  type GaugeDay,
  type TipQc,
} from "./rules";

export interface QcResult {
  opened: number;
  closed: number;
  rowsChanged: number;
  found: number;
}

/**
 * Runs every quality-control rule over a farm's rain and weather between two local dates (inclusive)
 * and stores the flags. Values are never changed or removed; rows are marked `flagged` with the reason.
 * Imports call it after writing; the recompute job calls it for the dates it rewrites.
 */
export async function runFarmQc(farmId: string, fromDate: string, toDate: string): Promise<QcResult> {
  const { farm, gauges, readings, records, weather } = await loadQcInputs(farmId, fromDate, toDate);
  const candidates: FlagCandidate[] = [];

  for (const w of weather) {
    candidates.push(
      ...weatherDayFlags({
        id: w.id,
        date: w.date,
        tmaxC: w.tmax_c,
        tminC: w.tmin_c,
        rhMaxPct: w.rh_max_pct,
        rhMinPct: w.rh_min_pct,
        windMs: w.wind_ms,
        solarMJm2: w.solar_mj_m2,
        rainMm: w.rain_mm,
        latitude: w.latitude,
        elevationM: w.elevation_m,
      }),
    );
  }

  const location = new Map(
    gauges.map((g) => [
      g.id,
      g.latitude !== null && g.longitude !== null
        ? { latitudeDeg: g.latitude, longitudeDeg: g.longitude }
        : null,
    ]),
  );
  const gaugeDays: GaugeDay[] = [];
  for (const r of readings) {
    const flag = readingRangeFlag({ id: r.id, date: r.rain_date, depthMm: r.depth_mm });
    if (flag) candidates.push(flag);
    gaugeDays.push({
      gaugeId: r.gauge_id,
      date: r.rain_date,
      depthMm: r.depth_mm,
      location: location.get(r.gauge_id) ?? null,
      entity: "rain_reading",
      entityIds: [r.id],
    });
  }

  for (const g of gauges) {
    const own = records.filter((r) => r.gauge_id === g.id);
    if (own.length === 0) continue;
    // records are unique per gauge and instant, so the instant finds the stored row again
    const byAt = new Map(own.map((r) => [r.at.getTime(), r]));
    const days = groupRecordsByAccountDay(
      own.map((r) => ({ at: r.at.getTime(), depthMm: r.depth_mm })),
      farm.time_zone,
      farm.rain_day_boundary_hour,
    ).filter((d) => d.date >= fromDate && d.date <= toDate);
    const tips: TipQc[] = [];
    for (const d of days) {
      const rows = d.records.flatMap((r) => byAt.get(Number(r.at)) ?? []);
      const ids = rows.map((r) => String(r.id));
      // A gauge with a manual reading that day is compared through the reading, not twice.
      if (!readings.some((x) => x.gauge_id === g.id && x.rain_date === d.date)) {
        gaugeDays.push({
          gaugeId: g.id,
          date: d.date,
          depthMm: d.rainMm,
          location: location.get(g.id) ?? null,
          entity: "rain_record",
          entityIds: ids,
        });
      }
      for (const r of rows) {
        if (r.interval_s === null)
          tips.push({
            id: String(r.id),
            date: d.date,
            atMs: r.at.getTime(),
            depthMm: r.depth_mm,
            resolutionMm: g.resolution_mm,
          });
      }
    }
    if (g.kind === "recording") candidates.push(...tipFlags(tips.sort((a, b) => a.atMs - b.atMs)));
  }
  candidates.push(...neighbourFlags(gaugeDays));

  const stored = await syncFlags(farmId, fromDate, toDate, candidates);
  return { ...stored, found: candidates.length };
}
