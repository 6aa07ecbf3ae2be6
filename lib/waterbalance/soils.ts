import { requirePositive, requireRange, WaterBalanceInputError } from "./errors";

/**
 * Soil water holding (FAO-56 eq. 82-83) and Rootbank's texture library: FAO-56 Table 19 water
 * contents and surface-layer REW/TEW, and Green-Ampt parameters of Rawls, Brakensiek and Miller (1983)
 * as tabulated by Chow, Maidment and Mays (1988) Table 4.3.1.
 */

/** Green-Ampt soil parameters. */
export interface GreenAmptParams {
  /** total porosity η, m³/m³ */
  porosity: number;
  /** effective porosity θe = η − θr, m³/m³ */
  effectivePorosity: number;
  /** wetting-front suction head ψ, mm */
  suctionMm: number;
  /** saturated hydraulic conductivity K, mm/h */
  ksatMmH: number;
}

/** Texture classes of the library (USDA names, kebab-case). */
export type TextureId =
  | "sand"
  | "loamy-sand"
  | "sandy-loam"
  | "loam"
  | "silt-loam"
  | "silt"
  | "sandy-clay-loam"
  | "clay-loam"
  | "silty-clay-loam"
  | "sandy-clay"
  | "silty-clay"
  | "clay";

/** One texture class with its defaults and where they come from. */
export interface SoilTexture {
  id: TextureId;
  name: string;
  /** default θFC, m³/m³ (middle of the range) */
  thetaFc: number;
  /** default θWP, m³/m³ (middle of the range) */
  thetaWp: number;
  thetaFcRange: readonly [number, number];
  thetaWpRange: readonly [number, number];
  /** readily evaporable water of the surface layer, mm */
  rewMm: number;
  /** total evaporable water of a 0.10 m surface layer, mm */
  tewMm: number;
  waterSource: string;
  greenAmpt: GreenAmptParams;
  greenAmptSource: string;
}

const T19 = "FAO-56 Table 19";
const T19_MEMORY = "FAO-56 Table 19 (from memory)";
const RBS82 =
  "θFC, θWP: Rawls, Brakensiek and Saxton (1982) at −33 and −1500 kPa (from memory); REW 9 mm and TEW by FAO-56 eq. 73 with Ze 0.10 m (common practice, no source)";
const RBM83 = "Rawls, Brakensiek and Miller (1983), via Chow, Maidment and Mays (1988) Table 4.3.1";

function tx(
  id: TextureId,
  name: string,
  fc: [number, number],
  wp: [number, number],
  rew: number,
  tew: number,
  waterSource: string,
  ga: [number, number, number, number],
  gaSource = RBM83,
): SoilTexture {
  return {
    id,
    name,
    thetaFc: round3((fc[0] + fc[1]) / 2),
    thetaWp: round3((wp[0] + wp[1]) / 2),
    thetaFcRange: fc,
    thetaWpRange: wp,
    rewMm: rew,
    tewMm: tew,
    waterSource,
    greenAmpt: {
      porosity: ga[0],
      effectivePorosity: ga[1],
      suctionMm: ga[2] * 10,
      ksatMmH: round3(ga[3] * 10),
    },
    greenAmptSource: gaSource,
  };
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}

/** The texture library. Ranges are FAO-56 Table 19's; REW and TEW are the middles of its ranges. */
export const SOIL_TEXTURES: readonly SoilTexture[] = Object.freeze([
  tx("sand", "Sand", [0.07, 0.17], [0.02, 0.07], 4.5, 9, T19, [0.437, 0.417, 4.95, 11.78]),
  tx("loamy-sand", "Loamy sand", [0.11, 0.19], [0.03, 0.1], 6, 11.5, T19, [0.437, 0.401, 6.13, 2.99]),
  tx("sandy-loam", "Sandy loam", [0.18, 0.28], [0.06, 0.16], 8, 17.5, T19, [0.453, 0.412, 11.01, 1.09]),
  tx("loam", "Loam", [0.2, 0.3], [0.07, 0.17], 9, 19, T19, [0.463, 0.434, 8.89, 0.34]),
  tx("silt-loam", "Silt loam", [0.22, 0.36], [0.09, 0.21], 9.5, 21.5, T19, [0.501, 0.486, 16.68, 0.65]),
  tx(
    "silt",
    "Silt",
    [0.28, 0.36],
    [0.12, 0.22],
    9.5,
    24,
    T19_MEMORY,
    [0.501, 0.486, 16.68, 0.65],
    `silt loam values (${RBM83} has no silt class)`,
  ),
  tx(
    "sandy-clay-loam",
    "Sandy clay loam",
    [0.255, 0.255],
    [0.148, 0.148],
    9,
    18.1,
    RBS82,
    [0.398, 0.33, 21.85, 0.15],
  ),
  tx("clay-loam", "Clay loam", [0.318, 0.318], [0.197, 0.197], 9, 21.9, RBS82, [0.464, 0.309, 20.88, 0.1]),
  tx(
    "silty-clay-loam",
    "Silty clay loam",
    [0.3, 0.37],
    [0.17, 0.24],
    9.5,
    24.5,
    T19,
    [0.471, 0.432, 27.3, 0.1],
  ),
  tx("sandy-clay", "Sandy clay", [0.339, 0.339], [0.239, 0.239], 9, 21.9, RBS82, [0.43, 0.321, 23.9, 0.06]),
  tx("silty-clay", "Silty clay", [0.3, 0.42], [0.17, 0.29], 10, 25, T19_MEMORY, [0.479, 0.423, 29.22, 0.05]),
  tx("clay", "Clay", [0.32, 0.4], [0.2, 0.24], 10, 25.5, T19, [0.475, 0.385, 31.63, 0.03]),
]);

/** The texture with id `id`, or undefined. */
export function findTexture(id: string): SoilTexture | undefined {
  return SOIL_TEXTURES.find((t) => t.id === id);
}

/**
 * Total available water TAW (mm) in a root zone `rootDepthM` deep, FAO-56 eq. 82:
 * TAW = 1000 (θFC − θWP) Zr.
 */
export function totalAvailableWaterMm(thetaFc: number, thetaWp: number, rootDepthM: number): number {
  return 1000 * (thetaFc - thetaWp) * rootDepthM;
}

/** Readily available water RAW (mm), FAO-56 eq. 83: RAW = p TAW. */
export function readilyAvailableWaterMm(tawMm: number, p: number): number {
  return p * tawMm;
}

/** How a field describes its soil: a texture from the library, explicit values, or both (explicit wins). */
export interface SoilSpec {
  texture?: TextureId;
  thetaFc?: number;
  thetaWp?: number;
  greenAmpt?: Partial<GreenAmptParams>;
  rewMm?: number;
  tewMm?: number;
}

/** A soil with every value the engine needs. */
export interface ResolvedSoil {
  thetaFc: number;
  thetaWp: number;
  greenAmpt: GreenAmptParams | null;
  rewMm: number;
  tewMm: number;
  texture: TextureId | null;
}

/** Fills a {@link SoilSpec} from the texture library and checks it (θWP < θFC < porosity ≤ 1). */
export function resolveSoil(spec: SoilSpec): ResolvedSoil {
  const tex = spec.texture ? findTexture(spec.texture) : undefined;
  if (spec.texture && !tex)
    throw new WaterBalanceInputError("soil.texture", `unknown texture "${spec.texture}"`);
  const thetaFc = spec.thetaFc ?? tex?.thetaFc;
  const thetaWp = spec.thetaWp ?? tex?.thetaWp;
  if (thetaFc === undefined || thetaWp === undefined) {
    throw new WaterBalanceInputError("soil", "give a texture or both thetaFc and thetaWp");
  }
  requireRange("soil.thetaFc", thetaFc, 0.01, 0.8);
  requireRange("soil.thetaWp", thetaWp, 0, 0.7);
  if (thetaWp >= thetaFc) throw new WaterBalanceInputError("soil.thetaWp", "must be below thetaFc");
  let greenAmpt: GreenAmptParams | null = null;
  const g0 = tex?.greenAmpt;
  const g1 = spec.greenAmpt;
  const ga = {
    porosity: g1?.porosity ?? g0?.porosity,
    effectivePorosity: g1?.effectivePorosity ?? g0?.effectivePorosity,
    suctionMm: g1?.suctionMm ?? g0?.suctionMm,
    ksatMmH: g1?.ksatMmH ?? g0?.ksatMmH,
  };
  if (
    ga.porosity !== undefined &&
    ga.effectivePorosity !== undefined &&
    ga.suctionMm !== undefined &&
    ga.ksatMmH !== undefined
  ) {
    requireRange("soil.greenAmpt.porosity", ga.porosity, 0.05, 0.9);
    requireRange("soil.greenAmpt.effectivePorosity", ga.effectivePorosity, 0.01, ga.porosity);
    requirePositive("soil.greenAmpt.suctionMm", ga.suctionMm);
    requirePositive("soil.greenAmpt.ksatMmH", ga.ksatMmH);
    greenAmpt = {
      porosity: ga.porosity,
      effectivePorosity: ga.effectivePorosity,
      suctionMm: ga.suctionMm,
      ksatMmH: ga.ksatMmH,
    };
  }
  const tewMm = spec.tewMm ?? tex?.tewMm ?? 1000 * (thetaFc - 0.5 * thetaWp) * 0.1;
  const rewMm = Math.min(spec.rewMm ?? tex?.rewMm ?? 9, tewMm);
  return { thetaFc, thetaWp, greenAmpt, rewMm, tewMm, texture: tex?.id ?? null };
}
