import type { FieldAccountInput, RainProvenance, RunoffProvenance, StormRunoffRecord } from "./account-types";
import { float64Columns, uint8Columns } from "./arrays";
import { RUNOFF_CURVE_NUMBER, RUNOFF_NONE, RUNOFF_STORM, type LoopCurveNumber } from "./balance-loop";
import type { CropStage } from "./crop-coefficient";
import { isoDateToDayNumber } from "./dates";
import { requireNonNegative, requireRange, WaterBalanceInputError } from "./errors";
import { greenAmptColumns, moistureDeficitFromDepletion } from "./green-ampt";
import { stormEnergyColumns, surfaceSealing } from "./rain-energy";
import {
  antecedentFormulaSource,
  curveNumberFor,
  curveNumberForCondition,
  potentialRetentionMm,
  slopeAdjustedCurveNumber,
  type AntecedentCondition,
  type HydrologicSoilGroup,
} from "./runoff";
import type { ResolvedSoil, TextureId } from "./soils";
import { hyetographColumns, stormBounds, type HyetographColumns } from "./storms";

/** Rain, irrigation, capillary rise and soil checks by day, and the runoff of time-stamped days. */

/** A time-stamped day ready for Green-Ampt: its hyetograph and storm bounds. */
export interface StormDay {
  hyetograph: HyetographColumns;
  bounds: number[];
  droppedTips: number;
}

/** The water side of a prepared season. */
export interface PreparedWaterSeason {
  rainMm: Float64Array;
  rainProvenance: RainProvenance[];
  runoffKind: Uint8Array;
  curveNumber: LoopCurveNumber | null;
  curveNumberAverage: number | null;
  curveNumberSource: string;
  iaRatio: number;
  irrigationGrossMm: Float64Array;
  irrigationNetMm: Float64Array;
  /** 0 none, 1 gross, 2 net, 3 both */
  irrigationBasis: Uint8Array;
  capillaryRiseMm: Float64Array;
  soilCheckMm: Float64Array;
  /** hyetographs of the time-stamped days, with their storms' [from, to) bounds */
  stormDays: Map<number, StormDay>;
}

const NO_RECORD: RainProvenance = Object.freeze({
  source: "no-record",
  gauges: Object.freeze([]) as readonly [],
  missing: false,
  recorded: false,
});

/** Hydrologic soil group guessed from texture when a field gives none (common practice, no source). */
const GROUP_BY_TEXTURE: Record<TextureId, HydrologicSoilGroup> = {
  sand: "A",
  "loamy-sand": "A",
  "sandy-loam": "B",
  loam: "B",
  "silt-loam": "B",
  silt: "B",
  "sandy-clay-loam": "C",
  "clay-loam": "D",
  "silty-clay-loam": "D",
  "sandy-clay": "D",
  "silty-clay": "D",
  clay: "D",
};

const CONDITIONS: AntecedentCondition[] = ["dry", "average", "wet"];

function curveNumberSetup(
  input: FieldAccountInput,
  soil: ResolvedSoil,
): { loop: LoopCurveNumber | null; average: number | null; source: string; iaRatio: number } {
  const spec = input.field.runoff ?? {};
  const iaRatio = spec.iaRatio ?? 0.2;
  if (spec.dailyMethod === "none") return { loop: null, average: null, source: "", iaRatio };
  let cn: number;
  let source: string;
  if (spec.curveNumber !== undefined) {
    cn = requireRange("field.runoff.curveNumber", spec.curveNumber, 30, 100);
    source = "field curve number";
  } else {
    const group = spec.hydrologicSoilGroup ?? (soil.texture ? GROUP_BY_TEXTURE[soil.texture] : "B");
    const cover = spec.cover ?? "row-crop-straight-good";
    cn = curveNumberFor(group, cover);
    source = `NEH 630 ch. 9 table, group ${group}${spec.hydrologicSoilGroup ? "" : " (from texture)"}, ${cover}`;
  }
  if (spec.slopeAdjust && input.field.slopePct !== undefined) {
    cn = slopeAdjustedCurveNumber(cn, input.field.slopePct);
    source += `, slope ${input.field.slopePct} % (Williams 1995)`;
  }
  const formula = spec.antecedentFormula ?? "hawkins-1985";
  const retention = (c: AntecedentCondition): number => {
    let s = potentialRetentionMm(curveNumberForCondition(cn, c, formula));
    if (iaRatio === 0.05) s = 25.4 * 1.33 * Math.pow(s / 25.4, 1.15);
    return s;
  };
  const fixed = spec.antecedent && spec.antecedent !== "account" ? CONDITIONS.indexOf(spec.antecedent) : -1;
  const th = spec.antecedentThresholds ?? {};
  return {
    loop: {
      retentionDryMm: retention("dry"),
      retentionAverageMm: retention("average"),
      retentionWetMm: retention("wet"),
      lambda: iaRatio,
      fixedCondition: fixed,
      wetAtOrBelow: th.wetAtOrBelow ?? 0.1,
      dryAtOrAbove: th.dryAtOrAbove ?? 0.5,
    },
    average: cn,
    source: `${source}; condition ${fixed >= 0 ? "fixed" : "from the account"}, ${antecedentFormulaSource(formula)}`,
    iaRatio,
  };
}

/** Builds the rain, irrigation, capillary-rise and soil-check arrays for the span. */
export function prepareWaterSeason(
  input: FieldAccountInput,
  soil: ResolvedSoil,
  startDay: number,
  n: number,
): PreparedWaterSeason {
  const f = float64Columns(n, 5);
  const b = uint8Columns(n, 2);
  const rainMm = f[0]!;
  const rainProvenance: RainProvenance[] = new Array<RainProvenance>(n).fill(NO_RECORD);
  const runoffKind = b[0]!;
  const cnSetup = curveNumberSetup(input, soil);
  const dailyKind = cnSetup.loop ? RUNOFF_CURVE_NUMBER : RUNOFF_NONE;
  runoffKind.fill(dailyKind);
  const stormDays = new Map<number, StormDay>();
  const seen = new Set<number>();
  for (const r of input.rain) {
    const d = isoDateToDayNumber(r.date, "rain.date") - startDay;
    if (d < 0 || d >= n) continue;
    if (seen.has(d))
      throw new WaterBalanceInputError("rain", `two rain entries for ${r.date}; give one per day`);
    seen.add(d);
    const gauges = r.source?.gauges ?? [];
    const source = r.source?.kind ?? "other";
    if (r.kind === "total") {
      const missing = r.rainMm === null;
      rainMm[d] = missing ? 0 : requireNonNegative("rain.rainMm", r.rainMm as number);
      rainProvenance[d] = { source, gauges, missing, recorded: false };
    } else {
      const { hyetograph, droppedTips } = hyetographColumns(r.records, input.options?.storms);
      let total = 0;
      for (let k = 0; k < hyetograph.n; k++) total += hyetograph.depthMm[k]!;
      rainMm[d] = total;
      rainProvenance[d] = { source, gauges, missing: false, recorded: true };
      if (soil.greenAmpt) {
        runoffKind[d] = RUNOFF_STORM;
        stormDays.set(d, {
          hyetograph,
          bounds: stormBounds(hyetograph, input.options?.storms?.dryGapH),
          droppedTips,
        });
      }
    }
  }
  const eff = input.system.applicationEfficiency;
  const irrigationGrossMm = f[1]!;
  const irrigationNetMm = f[2]!;
  const irrigationBasis = b[1]!;
  for (const ev of input.irrigations ?? []) {
    const d = isoDateToDayNumber(ev.date, "irrigations.date") - startDay;
    if (d < 0 || d >= n) continue;
    const depth = requireNonNegative("irrigations.depthMm", ev.depthMm);
    if (ev.basis === "gross") {
      irrigationGrossMm[d] = irrigationGrossMm[d]! + depth;
      irrigationNetMm[d] = irrigationNetMm[d]! + depth * eff;
      irrigationBasis[d] = irrigationBasis[d]! | 1;
    } else {
      irrigationGrossMm[d] = irrigationGrossMm[d]! + depth / eff;
      irrigationNetMm[d] = irrigationNetMm[d]! + depth;
      irrigationBasis[d] = irrigationBasis[d]! | 2;
    }
  }
  const capillaryRiseMm = f[3]!;
  for (const c of input.capillaryRise ?? []) {
    const d = isoDateToDayNumber(c.date, "capillaryRise.date") - startDay;
    if (d >= 0 && d < n)
      capillaryRiseMm[d] =
        capillaryRiseMm[d]! + requireNonNegative("capillaryRise.capillaryRiseMm", c.capillaryRiseMm);
  }
  const soilCheckMm = f[4]!.fill(NaN);
  for (const c of input.soilChecks ?? []) {
    const d = isoDateToDayNumber(c.date, "soilChecks.date") - startDay;
    if (d >= 0 && d < n) soilCheckMm[d] = requireNonNegative("soilChecks.depletionMm", c.depletionMm);
  }
  return {
    rainMm,
    rainProvenance,
    runoffKind,
    curveNumber: cnSetup.loop,
    curveNumberAverage: cnSetup.average,
    curveNumberSource: cnSetup.source,
    iaRatio: cnSetup.iaRatio,
    irrigationGrossMm,
    irrigationNetMm,
    irrigationBasis,
    capillaryRiseMm,
    soilCheckMm,
    stormDays,
  };
}

/**
 * The runoff hook for time-stamped days: each storm through Green-Ampt with the moisture deficit
 * from the day's start depletion (less what earlier storms that day let in), its kinetic energy
 * and EI30, and a surface seal after a high-energy storm on bare soil that lowers K for the days after.
 * Writes each day's runoff provenance into `provenance`.
 */
export function makeStormRunoff(
  input: FieldAccountInput,
  soil: ResolvedSoil,
  water: PreparedWaterSeason,
  stage: readonly CropStage[],
  rootDepthM: Float64Array,
  provenance: (RunoffProvenance | undefined)[],
): ((day: number, depletionStartMm: number) => number) | null {
  const ga = soil.greenAmpt;
  if (!ga || water.stormDays.size === 0) return null;
  const sealOpts = input.options?.sealing ?? {};
  const sealingOn = sealOpts.enabled !== false;
  const keMethod = input.options?.kineticEnergyMethod;
  let sealedThrough = -1;
  let sealFactor = 1;
  return (d: number, drStart: number): number => {
    const day = water.stormDays.get(d);
    if (!day) return 0;
    const sealed = d <= sealedThrough;
    const factor = sealed ? sealFactor : 1;
    const bare = stage[d] === "before" || stage[d] === "initial" || stage[d] === "after";
    let dr = drStart;
    let runoff = 0;
    let sealFormed = false;
    const records: StormRunoffRecord[] = [];
    const h = day.hyetograph;
    for (let b = 0; b < day.bounds.length; b += 2) {
      const from = day.bounds[b]!;
      const to = day.bounds[b + 1]!;
      const deltaTheta = moistureDeficitFromDepletion(ga, soil.thetaFc, dr, rootDepthM[d]!);
      const r = greenAmptColumns(h, from, to, ga, deltaTheta, { ksatFactor: factor });
      const e = stormEnergyColumns(h, from, to, keMethod);
      runoff += r.runoffMm;
      dr = Math.max(0, dr - r.infiltrationMm);
      let endMs = -Infinity;
      for (let k = from; k < to; k++) if (h.endMs[k]! > endMs) endMs = h.endMs[k]!;
      records.push({
        startMs: h.startMs[from]!,
        endMs,
        rainMm: r.rainMm,
        runoffMm: r.runoffMm,
        deltaTheta,
        ksatFactor: factor,
        energyMJha: e.energyMJha,
        i30MmH: e.i30MmH,
        ei30: e.ei30,
      });
      const seal = sealingOn ? surfaceSealing(e, bare, sealOpts) : null;
      if (seal) {
        sealFormed = true;
        if (d + seal.days > sealedThrough) sealedThrough = d + seal.days;
        sealFactor = seal.ksatFactor;
      }
    }
    provenance[d] = {
      method: "green-ampt",
      storms: records,
      sealed,
      sealFormed,
      droppedTips: day.droppedTips,
    };
    return runoff;
  };
}
