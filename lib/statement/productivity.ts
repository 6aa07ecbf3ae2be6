/**
 * Water productivity of the plantings whose yield is entered: kilograms harvested per cubic metre of
 * irrigation applied, and per cubic metre of crop ET. Pure.
 */

/** 1 t = 1,000 kg. */
const KG_PER_T = 1000;

export interface ProductivityInput {
  plantingId: string;
  fieldId: string;
  fieldName: string;
  cropName: string;
  season: string;
  areaHa: number;
  /** harvested yield, t/ha; null when not entered */
  yieldTHa: number | null;
  /** gross irrigation of the planting's account days in the statement, m³ */
  irrigationGrossM3: number;
  /** crop ET of the same days, m³ */
  etActualM3: number;
}

export interface Productivity extends ProductivityInput {
  yieldKg: number | null;
  /** kg per m³ of gross irrigation; null without a yield or without irrigation */
  kgPerM3Irrigation: number | null;
  /** kg per m³ of crop ET; null without a yield or without ET */
  kgPerM3Et: number | null;
}

/** Yield in kg over the planting's area and its productivity per m³ of water (kg/m³). */
export function productivityOf(p: ProductivityInput): Productivity {
  const yieldKg = p.yieldTHa === null ? null : p.yieldTHa * KG_PER_T * p.areaHa;
  return {
    ...p,
    yieldKg,
    kgPerM3Irrigation: yieldKg !== null && p.irrigationGrossM3 > 0 ? yieldKg / p.irrigationGrossM3 : null,
    kgPerM3Et: yieldKg !== null && p.etActualM3 > 0 ? yieldKg / p.etActualM3 : null,
  };
}
