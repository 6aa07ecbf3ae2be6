import { curveNumberForCondition, type FieldSeasonColumns, type RunoffProvenance } from "@/lib/waterbalance";
import type { AccountColumns } from "@/db/accounts";
import type { FieldRun } from "./inputs";
import { nextIsoDate } from "./station-eto";

/**
 * The engine's computed columns turned into account_days rows, column by column, with each day's
 * provenance as JSON text. Most days of a farm share their provenance pieces (the same ETo method, the
 * same gauges and weights), so each piece is serialised once and reused by identity.
 */

export function emptyColumns(): AccountColumns {
  return {
    fieldId: [], date: [], plantingId: [], etoMm: [], kc: [], etcMm: [], ks: [], etActualMm: [], rainMm: [], runoffMm: [],
    effectiveRainMm: [], irrigationGrossMm: [], irrigationNetMm: [], capillaryRiseMm: [], deepPercolationMm: [],
    depletionStartMm: [], depletionEndMm: [], tawMm: [], rawMm: [], pAdjusted: [], rootDepthM: [], soilCheckReset: [],
    provenanceIndex: [], provenanceTexts: [],
  };
}

/** Drops rows from `length` on (a field whose later stretch failed leaves none of its rows behind). */
export function truncateColumns(cols: AccountColumns, length: number): void {
  for (const [key, list] of Object.entries(cols) as [keyof AccountColumns, unknown[]][]) if (key !== "provenanceTexts") list.length = length;
}

const CONDITIONS = ["dry", "average", "wet"] as const;
const IRRIGATION_BASIS = ["none", "gross", "net", "mixed"] as const;

/** Serialises provenance pieces once per distinct object, and numbers each batch's distinct documents. */
export class ProvenanceWriter {
  private readonly pieces = new WeakMap<object, string>();
  private documents = new Map<string, number>();
  private batch: AccountColumns | null = null;

  /** The 1-based index of `json` among `out`'s distinct provenance documents. */
  index(out: AccountColumns, json: string): number {
    if (this.batch !== out) {
      this.batch = out;
      this.documents = new Map();
    }
    let k = this.documents.get(json);
    if (k === undefined) {
      out.provenanceTexts.push(json);
      k = out.provenanceTexts.length;
      this.documents.set(json, k);
    }
    return k;
  }

  piece(o: object): string {
    let s = this.pieces.get(o);
    if (s === undefined) {
      s = JSON.stringify(o);
      this.pieces.set(o, s);
    }
    return s;
  }
}

/** Appends a computed run's days to `out`. */
export function appendRunColumns(out: AccountColumns, run: FieldRun, cols: FieldSeasonColumns, writer: ProvenanceWriter): number {
  const { crop, water, loop } = cols;
  const n = crop.n;
  const dual = crop.dual !== null;
  const fieldId = run.field.id;
  const plantingId = run.planting.id;
  // The engine's curve-number provenance names the condition's curve number; one object per condition.
  const cnProv: (RunoffProvenance | null)[] = CONDITIONS.map((condition) =>
    water.curveNumberAverage === null
      ? null
      : {
          method: "curve-number",
          condition,
          curveNumber: Math.round(curveNumberForCondition(water.curveNumberAverage, condition) * 10) / 10,
          iaRatio: water.iaRatio,
          source: water.curveNumberSource,
        },
  );
  const none = '{"method":"none"}';
  let date = run.input.startDate;
  for (let d = 0; d < n; d++) {
    out.fieldId.push(fieldId);
    out.date.push(date);
    out.plantingId.push(plantingId);
    out.etoMm.push(crop.etoMm[d]!);
    out.kc.push(dual ? crop.kc[d]! + loop.ke[d]! : crop.kc[d]!);
    out.etcMm.push(loop.etcMm[d]!);
    out.ks.push(loop.ks[d]!);
    out.etActualMm.push(loop.etcAdjMm[d]!);
    out.rainMm.push(water.rainMm[d]!);
    out.runoffMm.push(loop.runoffMm[d]!);
    out.effectiveRainMm.push(loop.effectiveRainMm[d]!);
    out.irrigationGrossMm.push(water.irrigationGrossMm[d]!);
    out.irrigationNetMm.push(water.irrigationNetMm[d]!);
    out.capillaryRiseMm.push(water.capillaryRiseMm[d]!);
    out.deepPercolationMm.push(loop.deepPercolationMm[d]!);
    out.depletionStartMm.push(loop.depletionStartMm[d]!);
    out.depletionEndMm.push(loop.depletionEndMm[d]!);
    out.tawMm.push(crop.tawMm[d]!);
    out.rawMm.push(loop.rawMm[d]!);
    out.pAdjusted.push(loop.pAdjusted[d]!);
    out.rootDepthM.push(crop.rootDepthM[d]!);
    const reset = loop.soilCheckApplied[d] === 1;
    out.soilCheckReset.push(reset);

    const storm = cols.runoffProvenance[d];
    const cond = loop.condition[d]!;
    const cn = cond >= 0 ? cnProv[cond] : null;
    const runoff = storm ? writer.piece(storm) : cn ? writer.piece(cn) : none;
    const qc = run.qc.get(date);
    let json =
      `{"eto":${writer.piece(run.eto.provenance[d]!)},"rain":${writer.piece(run.rainSources[d]!)},"runoff":${runoff}` +
      `,"irrigation":"${IRRIGATION_BASIS[water.irrigationBasis[d]!]}","stage":"${crop.stage[d]}"`;
    if (dual) json += `,"kcb":${crop.kc[d]},"ke":${loop.ke[d]}`;
    if (reset) json += `,"carriedDepletionMm":${loop.carriedDepletionMm[d]}`;
    if (qc) json += `,"qc":${JSON.stringify(qc)}`;
    out.provenanceIndex.push(writer.index(out, json + "}"));
    date = nextIsoDate(date);
  }
  return n;
}
