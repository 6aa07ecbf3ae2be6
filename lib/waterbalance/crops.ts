import type { CoefficientCurve, StageLengths } from "./crop-coefficient";

/**
 * Rootbank's crop library: defaults from FAO-56 (Allen et al. 1998).
 * Kc from Table 12, Kcb from Table 17, stage lengths from one row of Table 11 (its region and
 * planting named), maximum root depth range and p from Table 22. Where a table gives a range, the
 * default is stated and the range kept. Zr min is 0.15 m for every crop (FAO-56 ch. 8: 0.15-0.20 m
 * at sowing). The maize, spring wheat, potato, tomato, cotton and alfalfa rows were checked against
 * the publication; the others were entered from memory of the tables and should be reviewed against
 * FAO-56 before they are relied on for advice.
 */
export interface CropLibraryEntry {
  id: string;
  name: string;
  /** FAO-56 Table 12 single crop coefficients */
  kc: CoefficientCurve;
  /** FAO-56 Table 17 basal crop coefficients */
  kcb: CoefficientCurve;
  /** maximum crop height, m (FAO-56 Table 12) */
  heightM: number;
  /** FAO-56 Table 11 stage lengths, days */
  stages: StageLengths;
  /** region and planting of the Table 11 row used */
  stagesRow: string;
  /** root depth at sowing, m */
  rootDepthMinM: number;
  /** default maximum root depth, m: the smaller Table 22 value, which FAO-56 suggests for irrigation scheduling */
  rootDepthMaxM: number;
  /** FAO-56 Table 22 range of maximum root depth, m */
  rootDepthMaxRangeM: readonly [number, number];
  /** FAO-56 Table 22 depletion fraction p for ETc ≈ 5 mm/d */
  pTable: number;
  /** which table each group of values comes from */
  sources: { kc: string; kcb: string; stages: string; rootsAndP: string };
  /** ranges the default was picked from, and other remarks */
  note?: string;
}

const SOURCES = {
  kc: "FAO-56 Table 12",
  kcb: "FAO-56 Table 17",
  stages: "FAO-56 Table 11",
  rootsAndP: "FAO-56 Table 22",
} as const;

interface Row {
  id: string;
  name: string;
  kc: [number, number, number];
  kcb: [number, number, number];
  h: number;
  st: [number, number, number, number];
  row: string;
  zr: [number, number];
  p: number;
  note?: string;
}

const ROWS: Row[] = [
  {
    id: "maize-grain",
    name: "Maize (grain)",
    kc: [0.3, 1.2, 0.35],
    kcb: [0.15, 1.15, 0.15],
    h: 2,
    st: [30, 40, 50, 30],
    row: "Spain (spring, summer); California: April",
    zr: [1.0, 1.7],
    p: 0.55,
    note: "Kc end 0.60-0.35 (0.35 when dried in the field); Kcb end 0.50-0.15",
  },
  {
    id: "maize-sweet",
    name: "Maize (sweet)",
    kc: [0.3, 1.15, 1.05],
    kcb: [0.15, 1.1, 1.0],
    h: 1.5,
    st: [20, 25, 25, 10],
    row: "Mediterranean: May/June",
    zr: [0.8, 1.2],
    p: 0.5,
  },
  {
    id: "wheat-spring",
    name: "Wheat (spring)",
    kc: [0.3, 1.15, 0.25],
    kcb: [0.15, 1.1, 0.15],
    h: 1,
    st: [20, 25, 60, 30],
    row: "East Africa: July",
    zr: [1.0, 1.5],
    p: 0.55,
    note: "Kc end 0.25-0.4; Kcb end 0.15-0.3",
  },
  {
    id: "wheat-winter",
    name: "Wheat (winter)",
    kc: [0.4, 1.15, 0.25],
    kcb: [0.15, 1.1, 0.15],
    h: 1,
    st: [30, 140, 40, 30],
    row: "California: December",
    zr: [1.5, 1.8],
    p: 0.55,
    note: "Kc ini 0.7 on frozen soil",
  },
  {
    id: "barley",
    name: "Barley",
    kc: [0.3, 1.15, 0.25],
    kcb: [0.15, 1.1, 0.15],
    h: 1,
    st: [15, 25, 50, 30],
    row: "Central India: November",
    zr: [1.0, 1.5],
    p: 0.55,
  },
  {
    id: "sorghum-grain",
    name: "Sorghum (grain)",
    kc: [0.3, 1.05, 0.55],
    kcb: [0.15, 1.0, 0.35],
    h: 1.5,
    st: [20, 35, 40, 30],
    row: "Arid region: April",
    zr: [1.0, 2.0],
    p: 0.55,
    note: "Kc mid 1.00-1.10; height 1-2 m",
  },
  {
    id: "rice",
    name: "Rice",
    kc: [1.05, 1.2, 0.75],
    kcb: [1.0, 1.15, 0.55],
    h: 1,
    st: [30, 30, 60, 30],
    row: "Tropics; Mediterranean: May",
    zr: [0.5, 1.0],
    p: 0.2,
    note: "Kc end 0.90-0.60; p is of saturation; a flooded paddy is outside this balance",
  },
  {
    id: "soybean",
    name: "Soybean",
    kc: [0.4, 1.15, 0.5],
    kcb: [0.15, 1.1, 0.3],
    h: 0.75,
    st: [20, 30, 60, 25],
    row: "Central USA: May",
    zr: [0.6, 1.3],
    p: 0.5,
    note: "height 0.5-1.0 m",
  },
  {
    id: "bean-dry",
    name: "Bean (dry)",
    kc: [0.4, 1.15, 0.35],
    kcb: [0.15, 1.1, 0.25],
    h: 0.4,
    st: [20, 30, 40, 20],
    row: "Continental climates: May/June",
    zr: [0.6, 0.9],
    p: 0.45,
  },
  {
    id: "bean-green",
    name: "Bean (green)",
    kc: [0.5, 1.05, 0.9],
    kcb: [0.15, 1.0, 0.8],
    h: 0.4,
    st: [20, 30, 30, 10],
    row: "California, Mediterranean: February/March",
    zr: [0.5, 0.7],
    p: 0.45,
  },
  {
    id: "groundnut",
    name: "Groundnut",
    kc: [0.4, 1.15, 0.6],
    kcb: [0.15, 1.1, 0.5],
    h: 0.4,
    st: [25, 35, 45, 25],
    row: "Dry West Africa: dry season",
    zr: [0.5, 1.0],
    p: 0.5,
  },
  {
    id: "pea-fresh",
    name: "Pea (fresh)",
    kc: [0.5, 1.15, 1.1],
    kcb: [0.15, 1.1, 1.05],
    h: 0.5,
    st: [15, 25, 35, 15],
    row: "Europe: May",
    zr: [0.6, 1.0],
    p: 0.35,
  },
  {
    id: "cotton",
    name: "Cotton",
    kc: [0.35, 1.175, 0.6],
    kcb: [0.15, 1.125, 0.45],
    h: 1.35,
    st: [30, 50, 60, 55],
    row: "Egypt, Pakistan, California: March-May",
    zr: [1.0, 1.7],
    p: 0.65,
    note: "Kc mid 1.15-1.20, Kc end 0.70-0.50, height 1.2-1.5 m",
  },
  {
    id: "sunflower",
    name: "Sunflower",
    kc: [0.35, 1.075, 0.35],
    kcb: [0.15, 1.025, 0.25],
    h: 2,
    st: [25, 35, 45, 25],
    row: "Mediterranean: April/May",
    zr: [0.8, 1.5],
    p: 0.45,
    note: "Kc mid 1.0-1.15",
  },
  {
    id: "potato",
    name: "Potato",
    kc: [0.5, 1.15, 0.75],
    kcb: [0.15, 1.1, 0.65],
    h: 0.6,
    st: [30, 35, 50, 30],
    row: "Europe: April",
    zr: [0.4, 0.6],
    p: 0.35,
  },
  {
    id: "sugar-beet",
    name: "Sugar beet",
    kc: [0.35, 1.2, 0.7],
    kcb: [0.15, 1.15, 0.5],
    h: 0.5,
    st: [30, 45, 90, 15],
    row: "California: April",
    zr: [0.7, 1.2],
    p: 0.55,
  },
  {
    id: "tomato",
    name: "Tomato",
    kc: [0.6, 1.15, 0.8],
    kcb: [0.15, 1.1, 0.7],
    h: 0.6,
    st: [35, 40, 50, 30],
    row: "California",
    zr: [0.7, 1.5],
    p: 0.4,
    note: "Kc end 0.70-0.90; Kcb end 0.60-0.80",
  },
  {
    id: "pepper-sweet",
    name: "Pepper (sweet)",
    kc: [0.6, 1.05, 0.9],
    kcb: [0.15, 1.0, 0.8],
    h: 0.7,
    st: [25, 35, 40, 20],
    row: "Europe and Mediterranean: April/June",
    zr: [0.5, 1.0],
    p: 0.3,
  },
  {
    id: "onion-dry",
    name: "Onion (dry)",
    kc: [0.7, 1.05, 0.75],
    kcb: [0.15, 0.95, 0.65],
    h: 0.4,
    st: [15, 25, 70, 40],
    row: "Mediterranean: April",
    zr: [0.3, 0.6],
    p: 0.3,
  },
  {
    id: "lettuce",
    name: "Lettuce",
    kc: [0.7, 1.0, 0.95],
    kcb: [0.15, 0.9, 0.9],
    h: 0.3,
    st: [20, 30, 15, 10],
    row: "Mediterranean: April",
    zr: [0.3, 0.5],
    p: 0.3,
  },
  {
    id: "cabbage",
    name: "Cabbage",
    kc: [0.7, 1.05, 0.95],
    kcb: [0.15, 0.95, 0.85],
    h: 0.4,
    st: [40, 60, 50, 15],
    row: "California desert: September",
    zr: [0.5, 0.8],
    p: 0.45,
  },
  {
    id: "carrot",
    name: "Carrot",
    kc: [0.7, 1.05, 0.95],
    kcb: [0.15, 0.95, 0.85],
    h: 0.3,
    st: [20, 30, 50, 20],
    row: "Arid region: October/January",
    zr: [0.5, 1.0],
    p: 0.35,
  },
  {
    id: "watermelon",
    name: "Watermelon",
    kc: [0.4, 1.0, 0.75],
    kcb: [0.15, 0.95, 0.7],
    h: 0.4,
    st: [20, 30, 30, 30],
    row: "Italy: April",
    zr: [0.8, 1.5],
    p: 0.4,
  },
  {
    id: "cucumber",
    name: "Cucumber",
    kc: [0.6, 1.0, 0.75],
    kcb: [0.15, 0.95, 0.7],
    h: 0.3,
    st: [20, 30, 40, 15],
    row: "Arid region: June/August",
    zr: [0.7, 1.2],
    p: 0.5,
  },
  {
    id: "cantaloupe",
    name: "Cantaloupe",
    kc: [0.5, 0.85, 0.6],
    kcb: [0.15, 0.75, 0.5],
    h: 0.3,
    st: [30, 45, 35, 10],
    row: "California",
    zr: [0.9, 1.5],
    p: 0.45,
  },
  {
    id: "alfalfa-cutting",
    name: "Alfalfa (hay, one cutting cycle)",
    kc: [0.4, 1.2, 1.15],
    kcb: [0.3, 1.15, 1.1],
    h: 0.7,
    st: [10, 30, 25, 10],
    row: "California: first cutting cycle",
    zr: [1.0, 2.0],
    p: 0.55,
    note: "averaged over cuttings, Kc is 0.40 / 0.95 / 0.90",
  },
  {
    id: "sugarcane",
    name: "Sugarcane (virgin)",
    kc: [0.4, 1.25, 0.75],
    kcb: [0.15, 1.2, 0.7],
    h: 3,
    st: [35, 60, 190, 120],
    row: "Low latitudes",
    zr: [1.2, 2.0],
    p: 0.65,
  },
];

function toEntry(r: Row): CropLibraryEntry {
  return {
    id: r.id,
    name: r.name,
    kc: { ini: r.kc[0], mid: r.kc[1], end: r.kc[2] },
    kcb: { ini: r.kcb[0], mid: r.kcb[1], end: r.kcb[2] },
    heightM: r.h,
    stages: { iniDays: r.st[0], devDays: r.st[1], midDays: r.st[2], lateDays: r.st[3] },
    stagesRow: r.row,
    rootDepthMinM: 0.15,
    rootDepthMaxM: r.zr[0],
    rootDepthMaxRangeM: [r.zr[0], r.zr[1]],
    pTable: r.p,
    sources: SOURCES,
    ...(r.note ? { note: r.note } : {}),
  };
}

/** The crop library, one entry per crop, in a stable order. */
export const CROP_LIBRARY: readonly CropLibraryEntry[] = Object.freeze(ROWS.map(toEntry));

/** The library entry with id `cropId`, or undefined. */
export function findCrop(cropId: string): CropLibraryEntry | undefined {
  return CROP_LIBRARY.find((c) => c.id === cropId);
}
