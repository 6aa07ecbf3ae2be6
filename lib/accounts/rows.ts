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
const NONE = { id: 0, json: '{"method":"none"}' };

/**
 * Serialises provenance pieces once per distinct object, and numbers each batch's distinct documents.
 * A day's document is looked up by a short key of its pieces' ids, so the JSON text is built only the
 * first time a combination appears in a batch.
 */
export class ProvenanceWriter {
  private readonly pieces = new WeakMap<object, { id: number; json: string }>();
  private nextId = 1;
  private documents = new Map<string, number>();
  private batch: AccountColumns | null = null;

  piece(o: object): { id: number; json: string } {
    let p = this.pieces.get(o);
    if (p === undefined) {
      p = { id: this.nextId++, json: JSON.stringify(o) };
      this.pieces.set(o, p);
    }
    return p;
  }

  /** The 1-based index of the document with `key` among `out`'s distinct documents; `build` makes its text. */
  index(out: AccountColumns, key: string, build: () => string): number {
    if (this.batch !== out) {
      this.batch = out;
      this.documents = new Map();
    }
    let k = this.documents.get(key);
    if (k === undefined) {
      out.provenanceTexts.push(build());
      k = out.provenanceTexts.length;
      this.documents.set(key, k);
    }
    return k;
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
    const runoff = storm ? writer.piece(storm) : cn ? writer.piece(cn) : NONE;
    const eto = writer.piece(run.eto.provenance[d]!);
    const rain = writer.piece(run.rainSources[d]!);
    const irrigation = IRRIGATION_BASIS[water.irrigationBasis[d]!];
    const stage = crop.stage[d];
    const qc = run.qc.get(date);
    const build = (): string => {
      let json = `{"eto":${eto.json},"rain":${rain.json},"runoff":${runoff.json},"irrigation":"${irrigation}","stage":"${stage}"`;
      if (dual) json += `,"kcb":${crop.kc[d]},"ke":${loop.ke[d]}`;
      if (reset) json += `,"carriedDepletionMm":${loop.carriedDepletionMm[d]}`;
      if (qc) json += `,"qc":${JSON.stringify(qc)}`;
      return json + "}";
    };
    // Days with their own numbers in the document (dual coefficient, soil-check resets) are never shared.
    const key = dual || reset ? `${fieldId}${date}` : `${eto.id},${rain.id},${runoff.id},${irrigation},${stage}${qc ? qc.join() : ""}`;
    out.provenanceIndex.push(writer.index(out, key, build));
    date = nextIsoDate(date);
  }
  return n;
}
