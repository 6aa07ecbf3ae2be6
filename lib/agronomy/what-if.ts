import "server-only";
import {
  errorStats,
  KC_SCALE_MAX,
  KC_SCALE_MIN,
  pairChecks,
  suggestKcScale,
  type CheckPair,
  type ErrorStats,
  type KcScaleSuggestion,
} from "@/lib/calibration";
import { listFieldChecks } from "@/db/agronomy";
import type { CurveEdit } from "@/lib/validation/agronomy";
import type { FieldAccountResult, KcUsed } from "@/lib/waterbalance";
import { applyCurveEdit, loadPlantingSeason } from "./season";

/** One day of a what-if line: depletion at the end of the day and the bands it is read against, mm. */
export interface PreviewDay {
  date: string;
  depletionMm: number;
  tawMm: number;
  rawMm: number;
  triggerMm: number;
  kc: number;
}

export interface CurvePreview {
  plantingId: string;
  from: string | null;
  to: string | null;
  saved: PreviewDay[];
  edited: PreviewDay[];
  kcUsed: { saved: KcUsed | null; edited: KcUsed | null };
  /** days the edited curve reaches the trigger, against the saved one's */
  daysAtOrPastTrigger: { saved: number; edited: number };
  estimate: true;
}

const r1 = (x: number) => Math.round(x * 10) / 10;
const r3 = (x: number) => Math.round(x * 1000) / 1000;

function line(result: FieldAccountResult | null): PreviewDay[] {
  return (result?.days ?? []).map((d) => ({
    date: d.date,
    depletionMm: r1(d.depletionEndMm),
    tawMm: r1(d.tawMm),
    rawMm: r1(d.rawMm),
    triggerMm: r1(d.triggerMm),
    kc: r3(d.kc),
  }));
}

/** The season's account with the saved curve and with the edited one, side by side; stores nothing. */
export async function previewCurve(
  farmId: string,
  plantingId: string,
  edit: CurveEdit,
  today?: string,
): Promise<CurvePreview> {
  const season = await loadPlantingSeason(farmId, plantingId, today);
  const saved = season.run(season.saved);
  const edited = season.run(applyCurveEdit(season.saved, season.crop, edit));
  const past = (days: PreviewDay[]) => days.filter((d) => d.depletionMm >= d.triggerMm).length;
  const savedLine = line(saved);
  const editedLine = line(edited);
  return {
    plantingId,
    from: season.span?.from ?? null,
    to: season.span?.to ?? null,
    saved: savedLine,
    edited: editedLine,
    kcUsed: { saved: saved?.kcUsed ?? null, edited: edited?.kcUsed ?? null },
    daysAtOrPastTrigger: { saved: past(savedLine), edited: past(editedLine) },
    estimate: true,
  };
}

export interface CalibrationReport {
  plantingId: string;
  kcScale: number;
  checks: (CheckPair & { id: string; method: string; resetsAccount: boolean; errorMm: number })[];
  /** checks with no account day (outside the season so far) */
  unmatched: number;
  stats: ErrorStats;
  suggestion: KcScaleSuggestion;
  estimate: true;
}

/**
 * Every soil check of the planting's season beside the depletion the account carried into that day
 * (before the check's reset), the error statistics, and a suggested Kc scale (lib/calibration/kc-scale.ts).
 */
export async function calibratePlanting(
  farmId: string,
  plantingId: string,
  today?: string,
): Promise<CalibrationReport> {
  const season = await loadPlantingSeason(farmId, plantingId, today);
  const base = { plantingId, kcScale: season.saved.kcScale, estimate: true as const };
  const none = {
    ...base,
    checks: [],
    unmatched: 0,
    stats: errorStats([]),
    suggestion: suggestKcScale([], () => []),
  };
  if (!season.span) return none;
  const checks = await listFieldChecks(season.field.id, season.span.from, season.span.to);
  const carried = (result: FieldAccountResult | null) =>
    new Map((result?.days ?? []).map((d) => [d.date, d.carriedDepletionMm]));
  const savedDays = carried(season.run(season.saved));
  if (savedDays.size === 0) return { ...none, unmatched: checks.length };
  const matched = checks.filter((c) => savedDays.has(c.date));
  const pairs = pairChecks(matched, savedDays);
  const observed = pairs.map((p) => p.observedMm);
  // Beyond the factor that lifts the highest Kc to 2 the engine caps the curve, so S(k) goes flat.
  const hi = Math.min(
    KC_SCALE_MAX,
    2 / Math.max(season.saved.kcIni, season.saved.kcMid, season.saved.kcEnd, 1e-6),
  );
  const suggestion = suggestKcScale(
    observed,
    (k) => {
      const days = carried(season.run({ ...season.saved, kcScale: k }));
      return pairs.map((p) => days.get(p.date) ?? NaN);
    },
    { hi: Math.max(hi, KC_SCALE_MIN + 0.01) },
  );
  return {
    ...base,
    checks: pairs.map((p, k) => {
      const c = matched[k]!;
      return {
        ...p,
        id: c.id,
        method: c.method,
        resetsAccount: c.resetsAccount,
        errorMm: p.modelledMm - p.observedMm,
      };
    }),
    unmatched: checks.length - pairs.length,
    stats: errorStats(pairs),
    suggestion,
  };
}
