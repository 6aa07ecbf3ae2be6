/**
 * A rough season of irrigation for the demo fields, so the logged events look like a farm team's: each
 * system's habits (drip little and often, pivots a pass at a time, furrows and bays a big soak when the
 * soil is well down), one set per system at a time, and no set that has not finished by the time the demo
 * is "now". The bookkeeping here is deliberately crude (Hargreaves ETo, no runoff, no stress); the app's
 * own engine computes the real account from the rows this produces.
 */
import { addDays, daysBetween, localInstant } from "./dates";
import type { CropValues } from "./library";
import { round, stream } from "./random";

export type Method = "depth" | "volume" | "hours" | "meter";

export interface SimSystem {
  key: string;
  kind: "drip" | "pivot" | "furrow" | "flood";
  efficiency: number;
  flowM3H: number;
  depthPerPassMm?: number;
  /** Local hour sets usually start. */
  startHour: number;
  method: Method;
  /** First reading of the system's water meter, m³ (method 'meter'). */
  meterStart?: number;
}

export interface SimField {
  key: string;
  areaHa: number;
  thetaFc: number;
  thetaWp: number;
  crop: CropValues;
  plantingDate: string;
  initialDepletionMm: number;
  /** Depletion, as a share of TAW, at which the team waters. */
  triggerShare: number;
  system: SimSystem;
  /** Daily rain booked to each local day at the field, mm. */
  rainMm: (date: string) => number;
  /** Soil checks to take: on `date`, the check reads the model's depletion times `bias`. */
  checks?: { date: string; bias: number }[];
}

export interface SimEvent {
  fieldKey: string;
  systemKey: string;
  date: string;
  startedAt: Date;
  endedAt: Date;
  grossMm: number;
  volumeM3: number;
  hours: number;
  method: Method;
  meterStart: number | null;
  meterEnd: number | null;
}

export interface SimCheck {
  fieldKey: string;
  date: string;
  depletionMm: number;
  rootDepthM: number;
}

/** FAO-56 single-coefficient curve (Fig. 25): flat, rising, flat, falling; after the season, the end value. */
function kcOn(crop: CropValues, day: number): number {
  const a = crop.stage_ini_days;
  const b = a + crop.stage_dev_days;
  const c = b + crop.stage_mid_days;
  const d = c + crop.stage_late_days;
  if (day < a) return crop.kc_ini;
  if (day < b) return crop.kc_ini + ((day - a) / Math.max(1, b - a)) * (crop.kc_mid - crop.kc_ini);
  if (day < c) return crop.kc_mid;
  if (day < d) return crop.kc_mid + ((day - c) / Math.max(1, d - c)) * (crop.kc_end - crop.kc_mid);
  return crop.kc_end;
}

/** Roots deepen from the minimum to the maximum by the start of mid-season (common practice). */
function rootDepthOn(crop: CropValues, day: number): number {
  const full = crop.stage_ini_days + crop.stage_dev_days;
  return (
    crop.root_min_m + (crop.root_max_m - crop.root_min_m) * Math.min(1, Math.max(0, day / Math.max(1, full)))
  );
}

/**
 * Runs every field from its planting date to `lastDay`; sets must end before `cutoffMs`.
 * `etoMm` gives the day's reference ET.
 */
export function simulateIrrigation(
  fields: readonly SimField[],
  etoMm: (date: string) => number,
  options: { from: string; lastDay: string; cutoffMs: number; timeZone: string },
): { events: SimEvent[]; checks: SimCheck[] } {
  const events: SimEvent[] = [];
  const checks: SimCheck[] = [];
  const depletion = new Map<string, number>();
  const busyUntil = new Map<string, number>();
  const meter = new Map<string, number>();

  for (let day = options.from; day <= options.lastDay; day = addDays(day, 1)) {
    for (const f of fields) {
      if (day < f.plantingDate) continue;
      const age = daysBetween(f.plantingDate, day);
      const crop = f.crop;
      // Harvested: the season is over and nobody waters the stubble.
      if (age >= crop.stage_ini_days + crop.stage_dev_days + crop.stage_mid_days + crop.stage_late_days)
        continue;
      const rootM = rootDepthOn(f.crop, age);
      const tawMm = 1000 * (f.thetaFc - f.thetaWp) * rootM;
      let dr = depletion.get(f.key) ?? f.initialDepletionMm;
      dr = Math.min(tawMm, Math.max(0, dr - f.rainMm(day) + kcOn(f.crop, age) * etoMm(day)));

      const check = f.checks?.find((c) => c.date === day);
      if (check) {
        dr = Math.min(tawMm, dr * check.bias);
        checks.push({ fieldKey: f.key, date: day, depletionMm: round(dr, 0), rootDepthM: round(rootM, 1) });
      }

      const sys = f.system;
      const nominal = localInstant(
        day,
        sys.startHour + stream(f.key, day, "start").between(0, 1.5),
        options.timeZone,
      );
      // A system waters one field at a time: the next set starts when the last one is done, the same day.
      const startMs = Math.max(nominal.getTime(), busyUntil.get(sys.key) ?? 0);
      const latestStartMs = localInstant(day, 20, options.timeZone).getTime();
      if (dr >= f.triggerShare * tawMm && startMs <= latestStartMs) {
        const grossMm = grossFor(sys, dr);
        const volumeM3 = round(grossMm * f.areaHa * 10, 0); // 1 mm over 1 ha is 10 m³
        const hours = round(volumeM3 / sys.flowM3H, 1);
        const endMs = startMs + hours * 3_600_000;
        if (endMs <= options.cutoffMs) {
          const meterStart = sys.method === "meter" ? (meter.get(sys.key) ?? sys.meterStart ?? 0) : null;
          const meterEnd = meterStart === null ? null : round(meterStart + volumeM3, 0);
          if (meterEnd !== null) meter.set(sys.key, meterEnd);
          events.push({
            fieldKey: f.key,
            systemKey: sys.key,
            date: day,
            startedAt: new Date(startMs),
            endedAt: new Date(endMs),
            grossMm,
            volumeM3,
            hours,
            method: sys.method,
            meterStart,
            meterEnd,
          });
          busyUntil.set(sys.key, endMs + 1_800_000); // half an hour to change over between sets
          dr = Math.max(0, dr - grossMm * sys.efficiency);
        }
      }
      depletion.set(f.key, dr);
    }
  }
  return { events, checks };
}

/**
 * A set's gross depth by the system's habit: a pivot puts on one pass; drip refills little and often;
 * a furrow or a bay cannot wet the whole field with less than a good soak, so it applies at least that.
 */
function grossFor(sys: SimSystem, depletionMm: number): number {
  const refill = depletionMm / sys.efficiency;
  switch (sys.kind) {
    case "pivot":
      return sys.depthPerPassMm ?? 12;
    case "drip":
      return round(Math.min(refill, 14), 1);
    case "furrow":
      return round(Math.min(Math.max(refill, 80), 180), 0);
    case "flood":
      return round(Math.min(Math.max(refill, 90), 180), 0);
  }
}
