/**
 * Published soil and crop values: the library every farm reads (farm_id null) and Kestrel Bend's own
 * tuned copies. The library rows are the engine's own tables (lib/waterbalance: SOIL_TEXTURES,
 * CROP_LIBRARY), so the database and the engine never disagree on a default; each row's `source` names
 * the publication and table behind it.
 */
import {
  CROP_LIBRARY,
  SOIL_TEXTURES,
  type CropLibraryEntry,
  type RunoffCover,
  type SoilTexture,
  type TextureId,
} from "../../lib/waterbalance";
import { round } from "./random";

export type HydrologicGroup = "A" | "B" | "C" | "D";

export interface SoilValues {
  name: string;
  texture: TextureId;
  theta_fc: number;
  theta_wp: number;
  theta_sat: number;
  rew_mm: number;
  tew_mm: number;
  ga_suction_mm: number;
  ga_ksat_mm_h: number;
  ga_porosity: number;
  ga_effective_porosity: number;
  hydrologic_group: HydrologicGroup;
  source: string;
  note: string | null;
}

export interface CropValues {
  name: string;
  kc_ini: number;
  kc_mid: number;
  kc_end: number;
  kcb_ini: number | null;
  kcb_mid: number | null;
  kcb_end: number | null;
  stage_ini_days: number;
  stage_dev_days: number;
  stage_mid_days: number;
  stage_late_days: number;
  height_m: number;
  root_min_m: number;
  root_max_m: number;
  p: number;
  runoff_cover: RunoffCover | null;
  source: string;
  note: string | null;
}

/**
 * Hydrologic soil group by texture, USDA TR-55 (1986) chapter 2: A sand, loamy sand, sandy loam; B silt
 * loam, loam; C sandy clay loam; D clay loam, silty clay loam, sandy clay, silty clay, clay. Silt is not
 * named there; it drains like silt loam, so B.
 */
const HYDROLOGIC_GROUP: Record<TextureId, HydrologicGroup> = {
  sand: "A",
  "loamy-sand": "A",
  "sandy-loam": "A",
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

function texture(id: TextureId): SoilTexture {
  const t = SOIL_TEXTURES.find((x) => x.id === id);
  if (!t) throw new Error(`no texture '${id}' in the engine's library`);
  return t;
}

/** A soil of one texture at its defaults, or with water contents picked inside the published ranges. */
function soil(
  id: TextureId,
  name: string,
  pick?: { fc: number; wp: number; rew: number; tew: number; note: string },
): SoilValues {
  const t = texture(id);
  const within = (v: number, [lo, hi]: readonly [number, number]) => v >= lo - 1e-9 && v <= hi + 1e-9;
  if (pick && !(within(pick.fc, t.thetaFcRange) && within(pick.wp, t.thetaWpRange))) {
    throw new Error(`${name}: θFC ${pick.fc} / θWP ${pick.wp} outside the published ranges for ${id}`);
  }
  return {
    name,
    texture: id,
    theta_fc: pick?.fc ?? t.thetaFc,
    theta_wp: pick?.wp ?? t.thetaWp,
    theta_sat: t.greenAmpt.porosity,
    rew_mm: pick?.rew ?? t.rewMm,
    tew_mm: pick?.tew ?? t.tewMm,
    ga_suction_mm: round(t.greenAmpt.suctionMm, 1),
    ga_ksat_mm_h: round(t.greenAmpt.ksatMmH, 2),
    ga_porosity: t.greenAmpt.porosity,
    ga_effective_porosity: t.greenAmpt.effectivePorosity,
    hydrologic_group: HYDROLOGIC_GROUP[id],
    source:
      `Water: ${t.waterSource} (${t.name.toLowerCase()}); Green-Ampt: ${t.greenAmptSource}; ` +
      "hydrologic group by texture: USDA TR-55 (1986) chapter 2",
    note: pick?.note ?? null,
  };
}

/** The library: one soil per texture class, named after it, at the middle of the published ranges. */
export const LIBRARY_SOILS: SoilValues[] = SOIL_TEXTURES.map((t) => soil(t.id, t.name));

/**
 * Kestrel Bend's own soils: the textures of its country (grey cracking clay on the river flats, red loam
 * on the rises, a sandy loam where the pivots run), water contents picked inside the FAO-56 Table 19
 * ranges to match the farm's probe calibration (invented for the demo).
 */
export const KESTREL_SOILS: SoilValues[] = [
  soil("clay", "River flat grey clay", {
    fc: 0.38,
    wp: 0.23,
    rew: 10,
    tew: 26,
    note: "Self-mulching grey clay; cracks when dry, so the first rain after a dry spell soaks in fast.",
  }),
  soil("loam", "Red loam", { fc: 0.27, wp: 0.12, rew: 9, tew: 20, note: "Red-brown earth on the rises." }),
  soil("sandy-loam", "Sandhill sandy loam", {
    fc: 0.21,
    wp: 0.09,
    rew: 8,
    tew: 17,
    note: "Sand ridge under the pivots.",
  }),
];

/** Rows the engine's authors checked against FAO-56 (lib/waterbalance/crops.ts); the rest are from memory. */
const CHECKED_CROPS = new Set([
  "maize-grain",
  "wheat-spring",
  "potato",
  "tomato",
  "cotton",
  "alfalfa-cutting",
]);

/** Cover class for the curve-number table: close-grown grains, close-seeded legumes, else row crops. */
function coverOf(id: string): RunoffCover {
  if (["wheat-spring", "wheat-winter", "barley", "rice"].includes(id)) return "small-grain-straight-good";
  if (id.startsWith("alfalfa")) return "legume-rotation-straight-good";
  return "row-crop-straight-good";
}

function cropFrom(e: CropLibraryEntry): CropValues {
  const reviewed = CHECKED_CROPS.has(e.id) ? "" : "; entered from memory, to be checked against the tables";
  return {
    name: e.name,
    kc_ini: e.kc.ini,
    kc_mid: e.kc.mid,
    kc_end: e.kc.end,
    kcb_ini: e.kcb.ini,
    kcb_mid: e.kcb.mid,
    kcb_end: e.kcb.end,
    stage_ini_days: e.stages.iniDays,
    stage_dev_days: e.stages.devDays,
    stage_mid_days: e.stages.midDays,
    stage_late_days: e.stages.lateDays,
    height_m: e.heightM,
    root_min_m: e.rootDepthMinM,
    root_max_m: e.rootDepthMaxM,
    p: e.pTable,
    runoff_cover: coverOf(e.id),
    source:
      `FAO-56 (Allen et al. 1998): Kc ${e.sources.kc}, Kcb ${e.sources.kcb}, stage lengths ${e.sources.stages} ` +
      `(${e.stagesRow}), maximum root depth and p ${e.sources.rootsAndP}${reviewed}`,
    note: e.note ?? null,
  };
}

/** The library crops: the engine's crop table, row for row. */
export const LIBRARY_CROPS: CropValues[] = CROP_LIBRARY.map(cropFrom);

function libraryCrop(id: string): CropValues {
  const e = CROP_LIBRARY.find((c) => c.id === id);
  if (!e) throw new Error(`no crop '${id}' in the engine's library`);
  return cropFrom(e);
}

/**
 * Kestrel Bend's crops: copies of library rows that its agronomist tuned for Riverina October sowings
 * (invented for the demo; FAO-56 advises local stage lengths where they are known).
 */
export const KESTREL_CROPS: CropValues[] = [
  {
    ...libraryCrop("maize-grain"),
    name: "Maize",
    stage_ini_days: 25,
    stage_dev_days: 40,
    stage_mid_days: 50,
    stage_late_days: 35,
    root_max_m: 1.2, // inside Table 22's 1.0-1.7; the probe sees roots to 1.2 m on the clay
    note: "Stage lengths for an October sowing in the Riverina; roots to 1.2 m seen on the probe.",
  },
  {
    ...libraryCrop("cotton"),
    name: "Cotton",
    root_max_m: 1.2,
    stage_late_days: 45,
    note: "Late season shortened: defoliated in late March.",
  },
  {
    ...libraryCrop("tomato"),
    name: "Processing tomato",
    root_min_m: 0.25, // transplanted seedlings start deeper than a sown crop
    note: "Transplanted; harvested by machine in February.",
  },
  {
    ...libraryCrop("alfalfa-cutting"),
    name: "Lucerne",
    // An established stand cut every four to five weeks: one long season at the cutting-averaged Kc
    // (FAO-56 Table 12, alfalfa hay averaged: 0.40 / 0.95 / 0.90), starting from the regrowing stand.
    kc_ini: 0.9,
    kc_mid: 0.95,
    kc_end: 0.9,
    kcb_ini: null, // the Table 17 values are for one cutting cycle, not this averaged curve
    kcb_mid: null,
    kcb_end: null,
    stage_ini_days: 20,
    stage_dev_days: 30,
    stage_mid_days: 200,
    stage_late_days: 60,
    root_min_m: 1.2,
    root_max_m: 1.5,
    note: "Third-year stand; one whole-season curve averaged over the cuttings.",
  },
];
