import { CROP_LIBRARY, SOIL_TEXTURES } from "@/lib/waterbalance";

/**
 * Where each published default of a library soil or crop comes from, value by value, read from the
 * engine's own libraries (lib/waterbalance/crops.ts and soils.ts), which the seeded library rows copy.
 */

/** Source of each crop value, or null when the crop is not one of the engine's library rows. */
export function cropValueSources(name: string): Record<string, string> | null {
  const e = CROP_LIBRARY.find((c) => c.name === name);
  if (!e) return null;
  const stages = `${e.sources.stages} (${e.stagesRow})`;
  return {
    kcIni: e.sources.kc,
    kcMid: e.sources.kc,
    kcEnd: e.sources.kc,
    kcbIni: e.sources.kcb,
    kcbMid: e.sources.kcb,
    kcbEnd: e.sources.kcb,
    heightM: e.sources.kc,
    stageIniDays: stages,
    stageDevDays: stages,
    stageMidDays: stages,
    stageLateDays: stages,
    rootMinM: "FAO-56 ch. 8 (0.15-0.20 m at sowing)",
    rootMaxM: `${e.sources.rootsAndP} (range ${e.rootDepthMaxRangeM[0]}-${e.rootDepthMaxRangeM[1]} m)`,
    p: e.sources.rootsAndP,
  };
}

/** Source of each soil value, or null when the texture is not in the engine's library. */
export function soilValueSources(texture: string): Record<string, string> | null {
  const t = SOIL_TEXTURES.find((x) => x.id === texture);
  if (!t) return null;
  return {
    thetaFc: `${t.waterSource} (range ${t.thetaFcRange[0]}-${t.thetaFcRange[1]})`,
    thetaWp: `${t.waterSource} (range ${t.thetaWpRange[0]}-${t.thetaWpRange[1]})`,
    rewMm: t.waterSource,
    tewMm: t.waterSource,
    thetaSat: `${t.greenAmptSource} (porosity)`,
    gaSuctionMm: t.greenAmptSource,
    gaKsatMmH: t.greenAmptSource,
    gaPorosity: t.greenAmptSource,
    gaEffectivePorosity: t.greenAmptSource,
    hydrologicGroup: "USDA TR-55 (1986) chapter 2",
  };
}
