/**
 * The daily root-zone balance on typed arrays, FAO-56 chapter 8 eq. 84-88 (and chapter 7 eq. 71-80
 * for the dual coefficient). No allocation per day: this is the hot path of every recompute.
 *
 *   Dr,i = Dr,i−1 − (P − RO)i − I,net,i − CRi + ETc,adj,i + DPi,   0 ≤ Dr ≤ TAW
 *
 * Order within a day: a soil check replaces the start depletion; p is adjusted for the day's ETc;
 * Ks comes from the start depletion (eq. 84); runoff follows the day's method with the antecedent
 * condition from the start depletion; ET is taken, then water beyond field capacity drains (eq. 88).
 */

import { float64Columns, uint8Columns } from "./arrays";

/** Runoff method of a day in {@link BalanceLoopInput.runoffKind}: all rain counts. */
export const RUNOFF_NONE = 0;
/** Runoff method: NRCS curve number on the daily total, condition from the start depletion. */
export const RUNOFF_CURVE_NUMBER = 1;
/** Runoff method: the `stormRunoff` hook (Green-Ampt on the day's time-stamped record). */
export const RUNOFF_STORM = 2;

/** Curve-number settings for the loop: retention S (mm) per antecedent condition and λ. */
export interface LoopCurveNumber {
  /** S for dry (I), average (II), wet (III), mm */
  retentionDryMm: number;
  retentionAverageMm: number;
  retentionWetMm: number;
  /** initial abstraction ratio λ */
  lambda: number;
  /** −1: condition from the account; 0 dry, 1 average, 2 wet: fixed */
  fixedCondition: number;
  /** wet when Dr/TAW ≤ this */
  wetAtOrBelow: number;
  /** dry when Dr/TAW ≥ this */
  dryAtOrAbove: number;
}

/** Dual-coefficient settings (FAO-56 chapter 7); `kc` then holds Kcb. */
export interface LoopDual {
  kcMax: Float64Array;
  /** effective ground cover fc (eq. 76) per day */
  coverFraction: Float64Array;
  tewMm: number;
  rewMm: number;
  /** wetted fraction of irrigation events (FAO-56 Table 20) */
  wettedFractionIrrigation: number;
  /** surface-layer depletion at the start, mm */
  initialDeMm: number;
}

/** Inputs of {@link balanceLoop}; every array has at least `nDays` entries. */
export interface BalanceLoopInput {
  nDays: number;
  initialDepletionMm: number;
  etoMm: Float64Array;
  /** single Kc, or Kcb when `dual` is given */
  kc: Float64Array;
  tawMm: Float64Array;
  /** FAO-56 Table 22 p before the ETc adjustment */
  pTable: Float64Array;
  rainMm: Float64Array;
  irrigationNetMm: Float64Array;
  capillaryRiseMm: Float64Array;
  /** measured depletion that resets the start of the day, NaN where there is none */
  soilCheckMm: Float64Array;
  /** RUNOFF_NONE, RUNOFF_CURVE_NUMBER or RUNOFF_STORM per day */
  runoffKind: Uint8Array;
  curveNumber: LoopCurveNumber | null;
  /** runoff (mm) of a time-stamped day, called in day order with the day's start depletion */
  stormRunoff: ((day: number, depletionStartMm: number) => number) | null;
  dual: LoopDual | null;
}

/** Outputs of {@link balanceLoop}, one entry per day. */
export interface BalanceLoopOutput {
  depletionStartMm: Float64Array;
  depletionEndMm: Float64Array;
  /** depletion carried from the day before, before any soil check, mm */
  carriedDepletionMm: Float64Array;
  etcMm: Float64Array;
  etcAdjMm: Float64Array;
  ks: Float64Array;
  pAdjusted: Float64Array;
  rawMm: Float64Array;
  runoffMm: Float64Array;
  effectiveRainMm: Float64Array;
  deepPercolationMm: Float64Array;
  /** antecedent condition used by the curve number: 0 dry, 1 average, 2 wet, −1 not used */
  condition: Int8Array;
  /** Ke and soil evaporation (dual coefficient only; 0 otherwise) */
  ke: Float64Array;
  evaporationMm: Float64Array;
  soilCheckApplied: Uint8Array;
}

/** Allocates an output block for `nDays` days (reuse it across fields of the same length). */
export function createBalanceLoopOutput(nDays: number): BalanceLoopOutput {
  const f = float64Columns(nDays, 13);
  const b = uint8Columns(nDays, 2);
  return {
    depletionStartMm: f[0]!,
    depletionEndMm: f[1]!,
    carriedDepletionMm: f[2]!,
    etcMm: f[3]!,
    etcAdjMm: f[4]!,
    ks: f[5]!,
    pAdjusted: f[6]!,
    rawMm: f[7]!,
    runoffMm: f[8]!,
    effectiveRainMm: f[9]!,
    deepPercolationMm: f[10]!,
    condition: new Int8Array(b[0]!.buffer, b[0]!.byteOffset, nDays),
    ke: f[11]!,
    evaporationMm: f[12]!,
    soilCheckApplied: b[1]!,
  };
}

/**
 * Runs the root-zone balance over `input.nDays` days into `out`, FAO-56 eq. 84-88 (single Kc) or
 * eq. 69-80 (dual: ETc,adj = (Ks Kcb + Ke) ETo). p = p(Tab) + 0.04 (5 − ETc) within 0.1-0.8.
 * Every day closes: Dr,start − Dr,end = (P − RO) + I,net + CR − ETc,adj − DP exactly (to rounding).
 * @returns the depletion at the end of the last day, mm
 */
export function balanceLoop(input: BalanceLoopInput, out: BalanceLoopOutput): number {
  const n = input.nDays;
  const { etoMm, kc, tawMm, pTable, rainMm, irrigationNetMm, capillaryRiseMm, soilCheckMm, runoffKind } =
    input;
  const cn = input.curveNumber;
  const storm = input.stormRunoff;
  const dual = input.dual;
  const oStart = out.depletionStartMm;
  const oEnd = out.depletionEndMm;
  const oCarried = out.carriedDepletionMm;
  const oEtc = out.etcMm;
  const oEta = out.etcAdjMm;
  const oKs = out.ks;
  const oP = out.pAdjusted;
  const oRaw = out.rawMm;
  const oRo = out.runoffMm;
  const oEff = out.effectiveRainMm;
  const oDp = out.deepPercolationMm;
  const oCond = out.condition;
  const oKe = out.ke;
  const oE = out.evaporationMm;
  const oCheck = out.soilCheckApplied;

  let dr = input.initialDepletionMm;
  let de = dual ? dual.initialDeMm : 0;
  let fwState = 1;

  for (let d = 0; d < n; d++) {
    const taw = tawMm[d]!;
    oCarried[d] = dr;
    // an initial depletion beyond TAW (or a root zone that shrank) is held at TAW; `carried` keeps the raw value
    if (dr > taw) dr = taw;
    const check = soilCheckMm[d]!;
    if (check === check) {
      dr = check < 0 ? 0 : check > taw ? taw : check;
      oCheck[d] = 1;
    } else {
      oCheck[d] = 0;
    }
    oStart[d] = dr;

    // runoff
    const rain = rainMm[d]!;
    let ro = 0;
    let cond = -1;
    const kind = runoffKind[d]!;
    if (kind === RUNOFF_CURVE_NUMBER && cn !== null && rain > 0) {
      if (cn.fixedCondition >= 0) cond = cn.fixedCondition;
      else {
        const frac = taw > 0 ? dr / taw : 0;
        cond = frac <= cn.wetAtOrBelow ? 2 : frac >= cn.dryAtOrAbove ? 0 : 1;
      }
      const s = cond === 0 ? cn.retentionDryMm : cond === 2 ? cn.retentionWetMm : cn.retentionAverageMm;
      const ia = cn.lambda * s;
      if (rain > ia) {
        const x = rain - ia;
        ro = (x * x) / (x + s);
      }
    } else if (kind === RUNOFF_STORM && storm !== null) {
      ro = storm(d, dr);
      if (ro < 0) ro = 0;
      else if (ro > rain) ro = rain;
    }
    const eff = rain - ro;
    const irr = irrigationNetMm[d]!;
    const cr = capillaryRiseMm[d]!;
    const eto = etoMm[d]!;

    // crop coefficient
    let kcPot: number;
    let ke = 0;
    let evap = 0;
    const kcb = kc[d]!;
    if (dual !== null) {
      if (eff >= 3) fwState = 1;
      else if (irr > 0) fwState = dual.wettedFractionIrrigation;
      const kcMax = dual.kcMax[d]!;
      let few = 1 - dual.coverFraction[d]!;
      if (fwState < few) few = fwState;
      if (few < 0.01) few = 0.01;
      de -= eff + (irr > 0 ? irr / dual.wettedFractionIrrigation : 0);
      if (de < 0) de = 0;
      const tew = dual.tewMm;
      const rew = dual.rewMm;
      const kr = de <= rew ? 1 : tew <= rew ? 0 : (tew - de) / (tew - rew);
      ke = kr * (kcMax - kcb);
      if (ke > few * kcMax) ke = few * kcMax;
      if (ke < 0) ke = 0;
      evap = ke * eto;
      const room = (tew - de) * few;
      if (evap > room) {
        evap = room > 0 ? room : 0;
        ke = eto > 0 ? evap / eto : 0;
      }
      de += evap / few;
      if (de > tew) de = tew;
      kcPot = kcb + ke;
    } else {
      kcPot = kcb;
    }
    const etc = kcPot * eto;
    let p = pTable[d]! + 0.04 * (5 - etc);
    if (p < 0.1) p = 0.1;
    else if (p > 0.8) p = 0.8;
    const raw = p * taw;
    let ks = 1;
    if (dr > raw) {
      const span = taw - raw;
      ks = span > 0 ? (taw - dr) / span : 0;
      if (ks < 0) ks = 0;
    }
    let eta = dual !== null ? (ks * kcb + ke) * eto : ks * etc;
    if (eta < 0) eta = 0;

    let end = dr - eff - irr - cr + eta;
    let dp = 0;
    if (end > taw) {
      // ET stops at wilting point; the floor at 0 only absorbs rounding when Dr starts at TAW
      eta -= end - taw;
      if (eta < 0) eta = 0;
      end = taw;
    } else if (end < 0) {
      dp = -end;
      end = 0;
    }
    oEnd[d] = end;
    oEtc[d] = etc;
    oEta[d] = eta;
    oKs[d] = ks;
    oP[d] = p;
    oRaw[d] = raw;
    oRo[d] = ro;
    oEff[d] = eff;
    oDp[d] = dp;
    oCond[d] = cond;
    oKe[d] = ke;
    oE[d] = evap;
    dr = end;
  }
  return dr;
}
