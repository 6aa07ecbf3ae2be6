import { curveNumberForCondition, type FieldSeasonColumns, type RunoffProvenance } from "@/lib/waterbalance";
import type { AccountDayRows } from "@/db/accounts";
import type { FieldRun } from "./inputs";
import { nextIsoDate } from "./station-eto";

/**
 * The engine's computed columns handed to the account_days writer run by run, with each day's provenance
 * as JSON text. Most days of a farm share their provenance pieces (the same ETo method, the same gauges
 * and weights), so each piece is serialised once and reused by identity, and a day whose pieces are
 * those of the day before reuses its document without building a key.
 */

const CONDITIONS = ["dry", "average", "wet"] as const;
const IRRIGATION_BASIS = ["none", "gross", "net", "mixed"] as const;
const NONE = { id: 0, json: '{"method":"none"}' };
/** Shared documents a run remembers by their pieces. */
const RECENT_DOCUMENTS = 6;

/**
 * Serialises provenance pieces once per distinct object, and numbers each batch's distinct documents.
 * A day's document is looked up by a short key of its pieces' ids, so the JSON text is built only the
 * first time a combination appears in a batch.
 */
export class ProvenanceWriter {
  private readonly pieces = new WeakMap<object, { id: number; json: string }>();
  private nextId = 1;
  private documents = new Map<string, number>();
  private batch: AccountDayRows | null = null;

  piece(o: object): { id: number; json: string } {
    let p = this.pieces.get(o);
    if (p === undefined) {
      p = { id: this.nextId++, json: JSON.stringify(o) };
      this.pieces.set(o, p);
    }
    return p;
  }

  /** The index of the document with `key` among `out`'s distinct documents, or -1 when it has none yet. */
  find(out: AccountDayRows, key: string): number {
    // A new or emptied batch starts its own numbering.
    if (this.batch !== out || out.provenanceTexts.length === 0) {
      this.batch = out;
      this.documents = new Map();
    }
    return this.documents.get(key) ?? -1;
  }

  /** Adds the document `json` under `key` to `out` (after {@link find} said it has none); returns its index. */
  add(out: AccountDayRows, key: string, json: string): number {
    const k = out.addProvenance(json);
    this.documents.set(key, k);
    return k;
  }
}

/** A day's provenance document. */
function provenanceJson(
  eto: string, rain: string, runoff: string, irrigation: string, stage: string | undefined,
  dual: { kcb: number; ke: number } | null, carriedDepletionMm: number | null, qc: readonly string[] | undefined,
): string {
  let json = `{"eto":${eto},"rain":${rain},"runoff":${runoff},"irrigation":"${irrigation}","stage":"${stage}"`;
  if (dual) json += `,"kcb":${dual.kcb},"ke":${dual.ke}`;
  if (carriedDepletionMm !== null) json += `,"carriedDepletionMm":${carriedDepletionMm}`;
  if (qc) json += `,"qc":${JSON.stringify(qc)}`;
  return json + "}";
}

/** Appends a computed run's days to `out`; returns how many. */
export function appendRunDays(out: AccountDayRows, run: FieldRun, cols: FieldSeasonColumns, writer: ProvenanceWriter): number {
  const { crop, water, loop } = cols;
  const n = crop.n;
  const dual = crop.dual !== null;
  const fieldId = run.field.id;
  const startDate = run.input.startDate;
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
  let kc = crop.kc;
  if (dual) {
    kc = new Float64Array(n);
    for (let d = 0; d < n; d++) kc[d] = crop.kc[d]! + loop.ke[d]!;
  }
  const docs = new Int32Array(n);
  const hasQc = run.qc.size > 0;
  let date = startDate;
  // The pieces of the last few shared documents (most days repeat one of them): a day with the same
  // pieces takes the same document, without building its key.
  const recent: { doc: number; eto: object; rain: object; runoff: object | null; basis: number; stage: string | undefined }[] = [];
  for (let d = 0; d < n; d++) {
    const reset = loop.soilCheckApplied[d] === 1;
    const cond = loop.condition[d]!;
    const runoffObj = cols.runoffProvenance[d] ?? (cond >= 0 ? cnProv[cond]! : null);
    const etoObj = run.eto.provenance[d]!;
    const rainObj = run.rainSources[d]!;
    const basis = water.irrigationBasis[d]!;
    const stage = crop.stage[d];
    const qc = hasQc ? run.qc.get(date) : undefined;
    if (hasQc) date = nextIsoDate(date);
    const own = dual || reset || qc !== undefined;
    if (!own) {
      let hit = -1;
      for (let r = 0; r < recent.length; r++) {
        const c = recent[r]!;
        if (c.eto === etoObj && c.rain === rainObj && c.runoff === runoffObj && c.basis === basis && c.stage === stage) {
          hit = c.doc;
          break;
        }
      }
      if (hit >= 0) {
        docs[d] = hit;
        continue;
      }
    }
    const runoff = runoffObj ? writer.piece(runoffObj) : NONE;
    const eto = writer.piece(etoObj);
    const rain = writer.piece(rainObj);
    const irrigation = IRRIGATION_BASIS[basis];
    // Days with their own numbers in the document (dual coefficient, soil-check resets) are never shared.
    const key = dual || reset ? `${fieldId}|${startDate}|${d}` : `${eto.id},${rain.id},${runoff.id},${irrigation},${stage}${qc ? qc.join() : ""}`;
    let doc = writer.find(out, key);
    if (doc < 0) {
      const json = provenanceJson(
        eto.json, rain.json, runoff.json, irrigation!, stage,
        dual ? { kcb: crop.kc[d]!, ke: loop.ke[d]! } : null, reset ? loop.carriedDepletionMm[d]! : null, qc,
      );
      doc = writer.add(out, key, json);
    }
    docs[d] = doc;
    if (!own) {
      if (recent.length === RECENT_DOCUMENTS) recent.pop();
      recent.unshift({ doc, eto: etoObj, rain: rainObj, runoff: runoffObj, basis, stage });
    }
  }
  out.append({
    fieldId,
    plantingId: run.planting.id,
    startDate,
    days: n,
    etoMm: crop.etoMm,
    kc,
    etcMm: loop.etcMm,
    ks: loop.ks,
    etActualMm: loop.etcAdjMm,
    rainMm: water.rainMm,
    runoffMm: loop.runoffMm,
    effectiveRainMm: loop.effectiveRainMm,
    irrigationGrossMm: water.irrigationGrossMm,
    irrigationNetMm: water.irrigationNetMm,
    capillaryRiseMm: water.capillaryRiseMm,
    deepPercolationMm: loop.deepPercolationMm,
    depletionStartMm: loop.depletionStartMm,
    depletionEndMm: loop.depletionEndMm,
    tawMm: crop.tawMm,
    rawMm: loop.rawMm,
    pAdjusted: loop.pAdjusted,
    rootDepthM: crop.rootDepthM,
    soilCheckReset: loop.soilCheckApplied,
    provenance: docs,
  });
  return n;
}
