import "server-only";
import { AccountDayRows, carriedDepletions, rewriteAccountDays } from "@/db/accounts";
import { loadFarmObservations, loadFarmSetup, type AccountField, type AccountPlanting } from "@/db/account-inputs";
import { db } from "@/db/knex";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso, computeFieldSeason, WaterBalanceInputError } from "@/lib/waterbalance";
import { buildFarmContext, buildFieldRun, byFieldId } from "./inputs";
import { appendRunDays, ProvenanceWriter } from "./rows";
import { StationEtoCache } from "./station-eto";

/**
 * Brings a farm's stored accounts up to date: every dirty field (or every field) is rewritten from its
 * dirty date to yesterday in the farm's time zone, depletion carried in from the stored day before.
 */

export interface RecomputeOptions {
  /** rewrite every field from the start of its plantings, dirty or not */
  all?: boolean;
  /** the farm's today (tests pin it); default: now in the farm's time zone */
  today?: string;
  /** fields per transaction */
  batchSize?: number;
}

export interface RecomputeResult {
  farmId: string;
  fields: number;
  days: number;
  /** fields whose mark was cleared; the others changed meanwhile and stay dirty */
  cleared: number;
  skipped: { fieldId: string; reason: string }[];
  ms: number;
}

/** One stretch of a field's account under one planting. */
interface Segment {
  planting: AccountPlanting;
  from: string;
  to: string;
  initialDepletionMm: number | null;
}

/**
 * The plantings a field's rewrite covers from `start` to `yesterday`: each planting until it ends or the
 * next one is sown. A later planting's rewrite carries depletion from the stored day before it.
 */
function segmentsFor(plantings: readonly AccountPlanting[], start: string, yesterday: string): Segment[] {
  const out: Segment[] = [];
  for (let k = 0; k < plantings.length; k++) {
    const p = plantings[k]!;
    const next = plantings[k + 1];
    let end = p.endDate && p.endDate < yesterday ? p.endDate : yesterday;
    if (next && next.plantingDate <= end) end = addDaysIso(next.plantingDate, -1);
    const from = start > p.plantingDate ? start : p.plantingDate;
    if (from > end) continue;
    out.push({ planting: p, from, to: end, initialDepletionMm: from === p.plantingDate ? p.initialDepletionMm : null });
  }
  return out;
}

/** Recomputes a farm's dirty field accounts (or all of them). */
export async function recomputeFarm(farmId: string, options: RecomputeOptions = {}): Promise<RecomputeResult> {
  const started = performance.now();
  // The marks (and their counters) are read before any input, so a change committed after this point
  // bumps a counter and keeps its field dirty for the next run.
  const setup = await loadFarmSetup(farmId, options.all ? "all" : "dirty");
  const result: RecomputeResult = { farmId, fields: 0, days: 0, cleared: 0, skipped: [], ms: 0 };
  if (!setup || setup.fields.length === 0) return { ...result, ms: performance.now() - started };
  const yesterday = addDaysIso(options.today ?? farmToday(setup.farm.timeZone), -1);
  const plantingsByField = new Map<string, AccountPlanting[]>();
  for (const p of setup.plantings) plantingsByField.set(p.fieldId, [...(plantingsByField.get(p.fieldId) ?? []), p]);

  const plans = new Map<string, Segment[]>();
  const wantCarry: { fieldId: string; date: string }[] = [];
  for (const f of setup.fields) {
    const plantings = plantingsByField.get(f.id) ?? [];
    const start = options.all || !f.dirtyFrom ? (plantings[0]?.plantingDate ?? yesterday) : f.dirtyFrom;
    const segs = segmentsFor(plantings, start, yesterday);
    plans.set(f.id, segs);
    for (const s of segs) if (s.initialDepletionMm === null) wantCarry.push({ fieldId: f.id, date: addDaysIso(s.from, -1) });
  }
  const carried = await carriedDepletions(db, wantCarry);
  let spanFrom = yesterday;
  let weatherFrom = yesterday;
  for (const [fieldId, segs] of plans) {
    for (const s of segs) {
      const c = carried.get(fieldId);
      if (s.initialDepletionMm === null) {
        // Without the stored day before (or one of another planting) the stretch is rewritten from sowing.
        if (c && c.plantingId === s.planting.id) s.initialDepletionMm = c.depletionEndMm;
        else {
          s.from = s.planting.plantingDate;
          s.initialDepletionMm = s.planting.initialDepletionMm;
        }
      }
      if (s.from < spanFrom) spanFrom = s.from;
      if (s.planting.plantingDate < weatherFrom) weatherFrom = s.planting.plantingDate;
    }
  }
  const fieldIds = setup.fields.map((f) => f.id);
  const obs = await loadFarmObservations(setup, fieldIds, { from: spanFrom, to: yesterday, weatherFrom });
  const ctx = buildFarmContext(setup, obs);
  const etoCache = new StationEtoCache();
  const writer = new ProvenanceWriter();
  const byField = { irrigations: byFieldId(obs.irrigations), soilChecks: byFieldId(obs.soilChecks) };

  const batchSize = options.batchSize ?? 125;
  // Batches touch disjoint fields, so they are written on two connections at once: PostgreSQL's share of
  // the work (heap and index entries, provenance documents) then runs beside the engine instead of after it.
  const chains: Promise<void>[] = [Promise.resolve(), Promise.resolve()];
  let failure: { err: unknown } | null = null;
  // One row buffer per connection, reused once that connection has written its previous batch.
  const buffers = chains.map(() => new AccountDayRows(Math.min(batchSize, setup.fields.length) * 366));
  for (let b = 0; b < setup.fields.length; b += batchSize) {
    const chain = (b / batchSize) % chains.length;
    await chains[chain]!.catch(() => undefined);
    if (failure) break;
    const batch = setup.fields.slice(b, b + batchSize);
    const rows = buffers[chain]!;
    rows.clear();
    const deleteFrom: { fieldId: string; fromDate: string }[] = [];
    const marks: { fieldId: string; seq: number }[] = [];
    for (let k = 0; k < batch.length; k++) {
      const f = batch[k]!;
      // Let the writes in flight take their next step while this batch is computed.
      if (k % 10 === 9) await new Promise((resolve) => setImmediate(resolve));
      const mark = rows.length;
      const outcome = computeField(f, plans.get(f.id) ?? [], (segment) => {
        const run = buildFieldRun(ctx, etoCache, f, segment.planting, { from: segment.from, to: segment.to, initialDepletionMm: segment.initialDepletionMm ?? 0 }, byField);
        if (!run) return "no soil or no weather station with days";
        return appendRunDays(rows, run, computeFieldSeason(run.input), writer);
      });
      if (typeof outcome === "string") {
        result.skipped.push({ fieldId: f.id, reason: outcome });
        rows.truncate(mark);
        if (!outcome.startsWith("no soil")) continue;
      } else result.days += outcome;
      const segs = plans.get(f.id) ?? [];
      const from = segs.length ? segs.map((s) => s.from).reduce((a, c) => (c < a ? c : a)) : (f.dirtyFrom ?? yesterday);
      deleteFrom.push({ fieldId: f.id, fromDate: from });
      marks.push({ fieldId: f.id, seq: f.dirtySeq });
      result.fields++;
    }
    // The next batch is computed while this one is written.
    const pending = chains[chain]!.then(async () => {
      result.cleared += (await rewriteAccountDays(deleteFrom, rows, marks)).length;
    });
    chains[chain] = pending;
    // A failed write stops the run at the next batch instead of after the last one.
    pending.catch((err: unknown) => {
      failure ??= { err };
    });
  }
  await Promise.all(chains);
  return { ...result, ms: performance.now() - started };
}

/** Runs a field's segments; an engine refusal is the field's skip reason, not the farm's failure. */
function computeField(field: AccountField, segments: readonly Segment[], run: (s: Segment) => number | string): number | string {
  let days = 0;
  try {
    for (const s of segments) {
      const r = run(s);
      if (typeof r === "string") return r;
      days += r;
    }
  } catch (err) {
    if (err instanceof WaterBalanceInputError) return `${field.name}: ${err.message}`;
    throw err;
  }
  return days;
}
