/**
 * Unit conversions used across the engine. Depths are mm, areas ha, volumes m³, speeds m/s,
 * energies MJ. 1 mm over 1 ha = 10 m³; 1 ML = 1,000 m³ = 100 mm over 1 ha.
 */

/** Latent-heat factor: 1 MJ m⁻² of energy evaporates 0.408 mm of water (FAO-56 eq. 20, λ = 2.45 MJ kg⁻¹). */
export const MJ_M2_TO_MM = 0.408;

/** Inches to millimetres (exact). */
export function inchesToMm(inches: number): number {
  return inches * 25.4;
}

/** Millimetres to inches (exact). */
export function mmToInches(depthMm: number): number {
  return depthMm / 25.4;
}

/** km/h to m/s. */
export function kmhToMs(speedKmh: number): number {
  return speedKmh / 3.6;
}

/** Degrees to radians. */
export function degToRad(deg: number): number {
  return (deg * Math.PI) / 180;
}

/** Degrees and minutes (e.g. 50°48') to decimal degrees; give a negative `degrees` for south or west. */
export function degMinToDecimal(degrees: number, minutes: number): number {
  const sign = degrees < 0 || Object.is(degrees, -0) ? -1 : 1;
  return sign * (Math.abs(degrees) + minutes / 60);
}

/** Depth in mm over `areaHa` hectares to a volume in m³ (1 mm on 1 ha = 10 m³). */
export function depthMmToVolumeM3(depthMm: number, areaHa: number): number {
  return depthMm * areaHa * 10;
}

/** Volume in m³ spread over `areaHa` hectares to a depth in mm. */
export function volumeM3ToDepthMm(volumeM3: number, areaHa: number): number {
  return volumeM3 / (areaHa * 10);
}

/** Megalitres to m³. */
export function megalitresToM3(volumeMl: number): number {
  return volumeMl * 1000;
}

/** Acre-feet to m³ (1 acre-foot = 1,233.48 m³). */
export function acreFeetToM3(volumeAcreFeet: number): number {
  return volumeAcreFeet * 1233.48184;
}

/** cm/h to mm/h. */
export function cmHToMmH(rateCmH: number): number {
  return rateCmH * 10;
}

/** Energy in MJ m⁻² d⁻¹ to its evaporation equivalent in mm d⁻¹ (FAO-56 eq. 20). */
export function energyMJm2ToMm(energyMJm2: number): number {
  return energyMJm2 * MJ_M2_TO_MM;
}

/** Rounds half away from zero to `digits` decimals (for presenting, never inside the balance). */
export function roundTo(value: number, digits: number): number {
  const f = 10 ** digits;
  return (Math.sign(value) * Math.round(Math.abs(value) * f)) / f;
}
