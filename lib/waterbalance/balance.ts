import type { AccountDay, FieldAccountInput, FieldAccountResult, RunoffProvenance } from "./account-types";
import {
  balanceLoop,
  createBalanceLoopOutput,
  type BalanceLoopInput,
  type BalanceLoopOutput,
} from "./balance-loop";
import { dayNumberToIsoDate } from "./dates";
import { prepareCropSeason, type PreparedCropSeason } from "./field-season";
import { makeStormRunoff, prepareWaterSeason, type PreparedWaterSeason } from "./rain-days";
import type { AntecedentCondition } from "./runoff";

/** The field's water account, FAO-56 chapter 8, one row per day with every term and its provenance. */

/** Books must close within this, mm. */
export const CLOSURE_TOLERANCE_MM = 0.01;

const NO_RUNOFF: RunoffProvenance = Object.freeze({ method: "none" });
const CONDITION_NAMES: AntecedentCondition[] = ["dry", "average", "wet"];
const IRRIGATION_BASIS = ["none", "gross", "net", "mixed"] as const;

/** A prepared, computed season in columns: what {@link runFieldAccount} turns into rows. */
export interface FieldSeasonColumns {
  crop: PreparedCropSeason;
  water: PreparedWaterSeason;
  loop: BalanceLoopOutput;
  runoffProvenance: (RunoffProvenance | undefined)[];
  /** trigger as a fraction of TAW, or null for RAW */
  triggerMad: number | null;
  finalDepletionMm: number;
}

/**
 * Prepares and runs a field's season into typed-array columns, without building rows
 * (the fast path for whole-farm recomputes). See {@link runFieldAccount} for the terms.
 */
export function computeFieldSeason(input: FieldAccountInput): FieldSeasonColumns {
  const crop = prepareCropSeason(input);
  const water = prepareWaterSeason(input, crop.soil, crop.startDay, crop.n);
  const runoffProvenance: (RunoffProvenance | undefined)[] = new Array<RunoffProvenance | undefined>(crop.n);
  const loopInput: BalanceLoopInput = {
    nDays: crop.n,
    initialDepletionMm: input.initialDepletionMm,
    etoMm: crop.etoMm,
    kc: crop.kc,
    tawMm: crop.tawMm,
    pTable: crop.pTable,
    rainMm: water.rainMm,
    irrigationNetMm: water.irrigationNetMm,
    capillaryRiseMm: water.capillaryRiseMm,
    soilCheckMm: water.soilCheckMm,
    runoffKind: water.runoffKind,
    curveNumber: water.curveNumber,
    stormRunoff: makeStormRunoff(input, crop.soil, water, crop.stage, crop.rootDepthM, runoffProvenance),
    dual: crop.dual,
  };
  const loop = createBalanceLoopOutput(crop.n);
  const finalDepletionMm = balanceLoop(loopInput, loop);
  return {
    crop,
    water,
    loop,
    runoffProvenance,
    triggerMad: input.planting.triggerMad ?? null,
    finalDepletionMm,
  };
}

/**
 * Runs a field's daily root-zone water account (FAO-56 ch. 8 eq. 84-88):
 * Dr,i = Dr,i−1 − (P − RO)i − I,net,i − CRi + ETc,adj,i + DPi with 0 ≤ Dr ≤ TAW.
 * ETo from given values or raw weather (FAO-56 eq. 6 with chapter 3 missing-data rules, or eq. 52);
 * Kc from the crop curve (eq. 66, climate-adjusted by eq. 62/65) or the dual coefficient (eq. 69-80);
 * root depth growing from Zr min to Zr max; p adjusted for ETc; Ks by eq. 84; runoff by Green-Ampt
 * for time-stamped days and the curve number for daily totals; net irrigation = gross × efficiency;
 * soil checks reset the start depletion.
 * @param input field, planting, system, weather, rain, irrigations, soil checks, span and initial depletion (mm)
 * @returns one {@link AccountDay} per day from startDate to endDate, each closing its books within 0.01 mm
 * @throws WaterBalanceInputError on impossible input
 */
export function runFieldAccount(input: FieldAccountInput): FieldAccountResult {
  const cols = computeFieldSeason(input);
  const days = accountRows(cols);
  let allClose = true;
  for (const d of days) if (!d.closure.closes) allClose = false;
  return { days, kcUsed: cols.crop.kcUsed, allClose, finalDepletionMm: cols.finalDepletionMm };
}

/** Turns computed columns into account rows. */
export function accountRows(cols: FieldSeasonColumns): AccountDay[] {
  const { crop, water, loop } = cols;
  const n = crop.n;
  const rows = new Array<AccountDay>(n);
  const dual = crop.dual !== null;
  const cnSource = water.curveNumberSource;
  const cnCache = new Map<number, RunoffProvenance>();
  for (let d = 0; d < n; d++) {
    const taw = crop.tawMm[d]!;
    const start = loop.depletionStartMm[d]!;
    const end = loop.depletionEndMm[d]!;
    const eff = loop.effectiveRainMm[d]!;
    const irr = water.irrigationNetMm[d]!;
    const cr = water.capillaryRiseMm[d]!;
    const eta = loop.etcAdjMm[d]!;
    const dp = loop.deepPercolationMm[d]!;
    const stored = start - end;
    const flow = eff + irr + cr - eta - dp;
    const err = stored - flow;
    let runoff: RunoffProvenance = NO_RUNOFF;
    const cond = loop.condition[d]!;
    const stormProv = cols.runoffProvenance[d];
    if (stormProv) runoff = stormProv;
    else if (cond >= 0 && water.curveNumberAverage !== null) {
      let cached = cnCache.get(cond);
      if (!cached) {
        const condition = CONDITION_NAMES[cond]!;
        cached = Object.freeze({
          method: "curve-number" as const,
          condition,
          curveNumber: curveNumberUsed(water, condition),
          iaRatio: water.iaRatio,
          source: cnSource,
        });
        cnCache.set(cond, cached);
      }
      runoff = cached;
    }
    const ke = loop.ke[d]!;
    const kcb = crop.kc[d]!;
    rows[d] = {
      date: dayNumberToIsoDate(crop.startDay + d),
      stage: crop.stage[d]!,
      etoMm: crop.etoMm[d]!,
      kc: dual ? kcb + ke : kcb,
      kcb: dual ? kcb : null,
      ke: dual ? ke : null,
      etcMm: loop.etcMm[d]!,
      ks: loop.ks[d]!,
      etcAdjMm: eta,
      rainMm: water.rainMm[d]!,
      runoffMm: loop.runoffMm[d]!,
      effectiveRainMm: eff,
      irrigationGrossMm: water.irrigationGrossMm[d]!,
      irrigationNetMm: irr,
      capillaryRiseMm: cr,
      deepPercolationMm: dp,
      depletionStartMm: start,
      depletionEndMm: end,
      tawMm: taw,
      rawMm: loop.rawMm[d]!,
      triggerMm: cols.triggerMad !== null ? cols.triggerMad * taw : loop.rawMm[d]!,
      pAdjusted: loop.pAdjusted[d]!,
      rootDepthM: crop.rootDepthM[d]!,
      soilCheckReset: loop.soilCheckApplied[d] === 1,
      carriedDepletionMm: loop.carriedDepletionMm[d]!,
      provenance: {
        eto: crop.etoProvenance[d]!,
        rain: water.rainProvenance[d]!,
        runoff,
        irrigation: IRRIGATION_BASIS[water.irrigationBasis[d]!]!,
      },
      closure: {
        storedChangeMm: stored,
        netFlowMm: flow,
        errorMm: err,
        closes: Math.abs(err) <= CLOSURE_TOLERANCE_MM,
      },
    };
  }
  return rows;
}

function curveNumberUsed(water: PreparedWaterSeason, condition: AntecedentCondition): number {
  const cn = water.curveNumber;
  if (!cn) return water.curveNumberAverage ?? 0;
  const s =
    condition === "dry" ? cn.retentionDryMm : condition === "wet" ? cn.retentionWetMm : cn.retentionAverageMm;
  // report the λ = 0.2 curve number the retention came from
  const s02 = cn.lambda === 0.05 ? 25.4 * Math.pow(s / 25.4 / 1.33, 1 / 1.15) : s;
  return Math.round((25400 / (s02 + 254)) * 10) / 10;
}
