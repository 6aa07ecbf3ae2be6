/**
 * The season statement's sums: a field's stored account days added up by month, turned into depths and
 * volumes, and the farm's totals as the sum of its fields' volumes. Pure: the rows come in already summed
 * by the database per field, planting and month.
 */
import { M3_PER_ACRE_FOOT, M3_PER_ML, M3_PER_MM_HA } from "@/lib/units";

/** One field's account days of one month and planting, each term summed (mm). */
export interface AccountSums {
  fieldId: string;
  plantingId: string | null;
  /** 'YYYY-MM' */
  month: string;
  days: number;
  /** the last of these days, ISO local date */
  lastDate: string;
  rainMm: number;
  runoffMm: number;
  effectiveRainMm: number;
  irrigationGrossMm: number;
  irrigationNetMm: number;
  capillaryRiseMm: number;
  /** potential crop ET, Kc × ETo */
  etcMm: number;
  /** crop ET the balance used (Ks × Kc × ETo, FAO-56 eq. 80) */
  etActualMm: number;
  deepPercolationMm: number;
  /** Σ (depletion at the start − depletion at the end) of each day: water gained by the root zone */
  storageChangeMm: number;
}

export type SumKey = Exclude<keyof AccountSums, "fieldId" | "plantingId" | "month" | "days" | "lastDate">;
export const SUM_KEYS: readonly SumKey[] = [
  "rainMm",
  "runoffMm",
  "effectiveRainMm",
  "irrigationGrossMm",
  "irrigationNetMm",
  "capillaryRiseMm",
  "etcMm",
  "etActualMm",
  "deepPercolationMm",
  "storageChangeMm",
];

/** The lines of a statement, in the order they are printed. */
export const TERMS = [
  "rain",
  "runoff",
  "effectiveRain",
  "irrigationGross",
  "applicationLoss",
  "irrigationNet",
  "capillaryRise",
  "etc",
  "etActual",
  "deepPercolation",
  "storageChange",
] as const;
export type Term = (typeof TERMS)[number];

export const TERM_LABELS: Record<Term, string> = {
  rain: "Rain",
  runoff: "Runoff",
  effectiveRain: "Effective rain",
  irrigationGross: "Irrigation applied, gross",
  applicationLoss: "Application losses (gross - net)",
  irrigationNet: "Irrigation applied, net",
  capillaryRise: "Capillary rise",
  etc: "Crop ET, potential (ETc)",
  etActual: "Crop ET, as used by the balance",
  deepPercolation: "Deep percolation",
  storageChange: "Storage change in the root zone",
};

/** A depth over an area, and the same water as a volume in the units a licence may be written in. */
export interface Quantity {
  depthMm: number;
  volumeM3: number;
  volumeMl: number;
  volumeAcreFt: number;
}

/** A volume (m³) spread over `areaHa`, with its ML and acre-feet; the depth is 0 over no area. */
export function quantityOf(volumeM3: number, areaHa: number): Quantity {
  return {
    depthMm: areaHa > 0 ? volumeM3 / (areaHa * M3_PER_MM_HA) : 0,
    volumeM3,
    volumeMl: volumeM3 / M3_PER_ML,
    volumeAcreFt: volumeM3 / M3_PER_ACRE_FOOT,
  };
}

/** m³ of a depth (mm) over an area (ha): 1 mm over 1 ha is 10 m³. */
export function volumeM3(depthMm: number, areaHa: number): number {
  return depthMm * areaHa * M3_PER_MM_HA;
}

/** Adds rows term by term (mm); `days` counts the field-days added. */
export function addSums(rows: readonly AccountSums[]): Record<SumKey, number> & { days: number } {
  const out = { days: 0 } as Record<SumKey, number> & { days: number };
  for (const k of SUM_KEYS) out[k] = 0;
  for (const r of rows) {
    out.days += r.days;
    for (const k of SUM_KEYS) out[k] += r[k];
  }
  return out;
}

export interface Totals {
  /** area of the fields that have at least one account day in the rows, ha */
  areaHa: number;
  /** account days added, one per field per day */
  fieldDays: number;
  /** the last account day added, or null when there is none */
  lastDate: string | null;
  lines: Record<Term, Quantity>;
  /**
   * What the balance leaves unexplained: (effective rain + net irrigation + capillary rise) − (crop ET +
   * deep percolation) − storage change. Every stored day closes to 0.01 mm, so the sum is near zero.
   */
  closure: Quantity;
}

/**
 * Totals of account rows over fields of known area: each field's depths become volumes on its own area
 * and the volumes add; the depth of a total is its volume over the area of the fields with days.
 * @param rows summed account days (mm) per field, planting and month
 * @param areaHaByField each field's area, ha
 */
export function totalsOf(rows: readonly AccountSums[], areaHaByField: ReadonlyMap<string, number>): Totals {
  const byField = new Map<string, AccountSums[]>();
  for (const r of rows) byField.set(r.fieldId, [...(byField.get(r.fieldId) ?? []), r]);
  const m3 = {} as Record<SumKey, number>;
  for (const k of SUM_KEYS) m3[k] = 0;
  let areaHa = 0;
  let fieldDays = 0;
  let lastDate: string | null = null;
  for (const [fieldId, fieldRows] of byField) {
    const area = areaHaByField.get(fieldId) ?? 0;
    const s = addSums(fieldRows);
    if (s.days === 0) continue;
    areaHa += area;
    fieldDays += s.days;
    for (const r of fieldRows) if (lastDate === null || r.lastDate > lastDate) lastDate = r.lastDate;
    for (const k of SUM_KEYS) m3[k] += volumeM3(s[k], area);
  }
  const q = (v: number) => quantityOf(v, areaHa);
  const closureM3 = m3.effectiveRainMm + m3.irrigationNetMm + m3.capillaryRiseMm - m3.etActualMm - m3.deepPercolationMm - m3.storageChangeMm;
  return {
    areaHa,
    fieldDays,
    lastDate,
    lines: {
      rain: q(m3.rainMm),
      runoff: q(m3.runoffMm),
      effectiveRain: q(m3.effectiveRainMm),
      irrigationGross: q(m3.irrigationGrossMm),
      applicationLoss: q(m3.irrigationGrossMm - m3.irrigationNetMm),
      irrigationNet: q(m3.irrigationNetMm),
      capillaryRise: q(m3.capillaryRiseMm),
      etc: q(m3.etcMm),
      etActual: q(m3.etActualMm),
      deepPercolation: q(m3.deepPercolationMm),
      storageChange: q(m3.storageChangeMm),
    },
    closure: q(closureM3),
  };
}
