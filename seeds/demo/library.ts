/**
 * Published soil and crop values: the library every farm reads (farm_id null) and Kestrel Bend's own
 * tuned copies. Each row's `source` names the publication and table the numbers come from.
 */

export interface SoilValues {
  name: string;
  texture: string;
  theta_fc: number;
  theta_wp: number;
  theta_sat: number;
  rew_mm: number;
  tew_mm: number;
  ga_suction_mm: number;
  ga_ksat_mm_h: number;
  ga_porosity: number;
  ga_effective_porosity: number;
  hydrologic_group: "A" | "B" | "C" | "D";
  source: string;
  note?: string;
}

export interface CropValues {
  name: string;
  kc_ini: number;
  kc_mid: number;
  kc_end: number;
  stage_ini_days: number;
  stage_dev_days: number;
  stage_mid_days: number;
  stage_late_days: number;
  height_m: number;
  root_min_m: number;
  root_max_m: number;
  p: number;
  source: string;
  note?: string;
}

/**
 * One texture: FAO-56 Table 19 ranges (θFC, θWP m³/m³; REW, TEW mm) and Rawls, Brakensiek and Miller (1983)
 * Green-Ampt values (porosity, effective porosity, suction cm, Ks cm/h) as tabulated in Chow, Maidment and
 * Mays (1988) Table 4.3.1. The library takes the middle of each FAO range; θsat is the Rawls porosity.
 */
interface Texture {
  fc: readonly [number, number];
  wp: readonly [number, number];
  rew: readonly [number, number];
  tew: readonly [number, number];
  rawls: readonly [porosity: number, effective: number, suctionCm: number, ksatCmH: number];
  /** USDA TR-55 (1986) chapter 2: hydrologic soil group by texture. */
  group: "A" | "B" | "C" | "D";
}

const TEXTURES: Record<string, Texture> = {
  sand: {
    fc: [0.07, 0.17],
    wp: [0.02, 0.07],
    rew: [2, 7],
    tew: [6, 12],
    rawls: [0.437, 0.417, 4.95, 11.78],
    group: "A",
  },
  "loamy sand": {
    fc: [0.11, 0.19],
    wp: [0.03, 0.1],
    rew: [4, 8],
    tew: [9, 14],
    rawls: [0.437, 0.401, 6.13, 2.99],
    group: "A",
  },
  "sandy loam": {
    fc: [0.18, 0.28],
    wp: [0.06, 0.16],
    rew: [6, 10],
    tew: [15, 20],
    rawls: [0.453, 0.412, 11.01, 1.09],
    group: "A",
  },
  loam: {
    fc: [0.2, 0.3],
    wp: [0.07, 0.17],
    rew: [8, 10],
    tew: [16, 22],
    rawls: [0.463, 0.434, 8.89, 0.34],
    group: "B",
  },
  "silt loam": {
    fc: [0.22, 0.36],
    wp: [0.09, 0.21],
    rew: [8, 11],
    tew: [18, 25],
    rawls: [0.501, 0.486, 16.68, 0.65],
    group: "B",
  },
  "silty clay loam": {
    fc: [0.3, 0.37],
    wp: [0.17, 0.24],
    rew: [8, 11],
    tew: [22, 27],
    rawls: [0.471, 0.432, 27.3, 0.1],
    group: "D",
  },
  clay: {
    fc: [0.32, 0.4],
    wp: [0.2, 0.24],
    rew: [8, 12],
    tew: [22, 29],
    rawls: [0.475, 0.385, 31.63, 0.03],
    group: "D",
  },
};

const mid = (r: readonly [number, number]) => Math.round(((r[0] + r[1]) / 2) * 1000) / 1000;

function sourceFor(texture: string): string {
  return (
    `FAO-56 (Allen et al. 1998) Table 19, ${texture}; Green-Ampt: Rawls, Brakensiek and Miller (1983) via ` +
    `Chow, Maidment and Mays (1988) Table 4.3.1, ${texture}; hydrologic group by texture: USDA TR-55 (1986) chapter 2`
  );
}

function textureSoil(
  texture: string,
  name: string,
  pick?: { fc: number; wp: number; rew: number; tew: number },
): SoilValues {
  const t = TEXTURES[texture];
  if (!t) throw new Error(`no published values for texture '${texture}'`);
  const [porosity, effective, suctionCm, ksatCmH] = t.rawls;
  return {
    name,
    texture,
    theta_fc: pick?.fc ?? mid(t.fc),
    theta_wp: pick?.wp ?? mid(t.wp),
    theta_sat: porosity,
    rew_mm: pick?.rew ?? mid(t.rew),
    tew_mm: pick?.tew ?? mid(t.tew),
    ga_suction_mm: Math.round(suctionCm * 100) / 10,
    ga_ksat_mm_h: Math.round(ksatCmH * 100) / 10,
    ga_porosity: porosity,
    ga_effective_porosity: effective,
    hydrologic_group: t.group,
    source: sourceFor(texture),
  };
}

/** The library: one soil per texture, named after it, at the middle of the published ranges. */
export const LIBRARY_SOILS: SoilValues[] = Object.keys(TEXTURES).map((texture) =>
  textureSoil(texture, texture.charAt(0).toUpperCase() + texture.slice(1)),
);

/**
 * Kestrel Bend's own soils: the textures of its country (grey cracking clay on the river flats, red loam
 * on the rises, a sandy loam where the pivots run), with water contents picked inside the FAO-56 ranges
 * to match the farm's probe calibration (invented for the demo).
 */
export const KESTREL_SOILS: SoilValues[] = [
  {
    ...textureSoil("clay", "River flat grey clay", { fc: 0.38, wp: 0.23, rew: 10, tew: 26 }),
    note: "Self-mulching grey clay; cracks when dry, so the first rain after a dry spell soaks in fast.",
  },
  {
    ...textureSoil("loam", "Red loam", { fc: 0.27, wp: 0.12, rew: 9, tew: 20 }),
    note: "Red-brown earth on the rises.",
  },
  { ...textureSoil("sandy loam", "Sandhill sandy loam", { fc: 0.21, wp: 0.09, rew: 8, tew: 17 }) },
];

const CROP_SOURCE =
  "FAO-56 (Allen et al. 1998): Kc and height Table 12, stage lengths Table 11, maximum root depth and p Table 22";

/**
 * The library crops, FAO-56 values. Where a table gives a range the row takes a stated point in it;
 * minimum root depth is common practice (0.15-0.25 m at sowing or transplanting), no table.
 */
export const LIBRARY_CROPS: CropValues[] = [
  {
    name: "Maize (grain)",
    kc_ini: 0.3,
    kc_mid: 1.2,
    kc_end: 0.35, // 0.35 for grain left to dry in the field; 0.60 when harvested at high moisture
    stage_ini_days: 30,
    stage_dev_days: 40,
    stage_mid_days: 50,
    stage_late_days: 30,
    height_m: 2,
    root_min_m: 0.15,
    root_max_m: 1.3, // range 1.0-1.7
    p: 0.55,
    source: `${CROP_SOURCE} (maize, grain; stages: Spain, California, April)`,
  },
  {
    name: "Cotton",
    kc_ini: 0.35,
    kc_mid: 1.175, // 1.15-1.20
    kc_end: 0.6, // 0.70-0.50
    stage_ini_days: 30,
    stage_dev_days: 50,
    stage_mid_days: 60,
    stage_late_days: 55,
    height_m: 1.35, // 1.2-1.5
    root_min_m: 0.15,
    root_max_m: 1.3, // range 1.0-1.7
    p: 0.65,
    source: `${CROP_SOURCE} (cotton)`,
  },
  {
    name: "Tomato (processing)",
    kc_ini: 0.6,
    kc_mid: 1.15,
    kc_end: 0.8, // 0.70-0.90
    stage_ini_days: 35,
    stage_dev_days: 40,
    stage_mid_days: 50,
    stage_late_days: 30,
    height_m: 0.6,
    root_min_m: 0.25, // transplanted
    root_max_m: 1.0, // range 0.7-1.5
    p: 0.4,
    source: `${CROP_SOURCE} (tomato; stages: California)`,
  },
  {
    name: "Lucerne (alfalfa hay)",
    // Averaged over cuttings, which suits a season-long single curve; single cuttings run 0.40 / 1.20 / 1.15.
    kc_ini: 0.4,
    kc_mid: 0.95,
    kc_end: 0.9,
    // Table 11's first cutting cycle (California); from memory, not confirmed against the table.
    stage_ini_days: 10,
    stage_dev_days: 20,
    stage_mid_days: 20,
    stage_late_days: 10,
    height_m: 0.7,
    root_min_m: 0.15,
    root_max_m: 1.5, // range 1.0-2.0
    p: 0.55,
    source: `${CROP_SOURCE} (alfalfa hay, averaged cutting effects; stage lengths from memory)`,
  },
  {
    name: "Wheat (spring)",
    kc_ini: 0.3,
    kc_mid: 1.15,
    kc_end: 0.3, // 0.25-0.4
    stage_ini_days: 20,
    stage_dev_days: 25,
    stage_mid_days: 60,
    stage_late_days: 30,
    height_m: 1,
    root_min_m: 0.15,
    root_max_m: 1.25, // range 1.0-1.5
    p: 0.55,
    source: `${CROP_SOURCE} (spring wheat)`,
  },
  {
    name: "Potato",
    kc_ini: 0.5,
    kc_mid: 1.15,
    kc_end: 0.75,
    stage_ini_days: 30,
    stage_dev_days: 35,
    stage_mid_days: 50,
    stage_late_days: 30,
    height_m: 0.6,
    root_min_m: 0.15,
    root_max_m: 0.5, // range 0.4-0.6
    p: 0.35,
    source: `${CROP_SOURCE} (potato; stages: Europe, April)`,
  },
];

function libraryCrop(name: string): CropValues {
  const crop = LIBRARY_CROPS.find((c) => c.name === name);
  if (!crop) throw new Error(`no library crop '${name}'`);
  return crop;
}

/**
 * Kestrel Bend's crops: copies of the library rows with stage lengths the agronomist set for Riverina
 * October sowings (invented for the demo; FAO-56 advises local stage lengths where known).
 */
export const KESTREL_CROPS: CropValues[] = [
  {
    ...libraryCrop("Maize (grain)"),
    name: "Maize",
    stage_ini_days: 25,
    stage_dev_days: 40,
    stage_mid_days: 50,
    stage_late_days: 35,
    note: "Stage lengths for an October sowing in the Riverina.",
  },
  {
    ...libraryCrop("Cotton"),
    name: "Cotton",
    stage_late_days: 45,
    note: "Late season shortened: defoliated in late March.",
  },
  { ...libraryCrop("Tomato (processing)"), name: "Processing tomato" },
  {
    ...libraryCrop("Lucerne (alfalfa hay)"),
    name: "Lucerne",
    // An established stand cut every four to five weeks: one long mid-season at the cutting-averaged Kc.
    kc_ini: 0.9,
    stage_ini_days: 20,
    stage_dev_days: 30,
    stage_mid_days: 200,
    stage_late_days: 60,
    root_min_m: 1.2,
    root_max_m: 1.5,
    note: "Third-year stand; whole-season curve over the cuttings.",
  },
];
