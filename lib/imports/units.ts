/**
 * Unit conversions for imported columns. Each file names its units; everything is stored in the
 * engine's units (°C, m/s, MJ m⁻², mm).
 */
import { inchesToMm, kmhToMs } from "@/lib/waterbalance";

export const TEMPERATURE_UNITS = ["C", "F"] as const;
export const WIND_UNITS = ["m/s", "km/h", "mph", "knots"] as const;
export const SOLAR_UNITS = ["MJ/m2", "W/m2"] as const;
export const RAIN_UNITS = ["mm", "in"] as const;

export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];
export type WindUnit = (typeof WIND_UNITS)[number];
export type SolarUnit = (typeof SOLAR_UNITS)[number];
export type RainUnit = (typeof RAIN_UNITS)[number];

/** °F to °C: (F − 32) × 5/9 (the definition of the Fahrenheit scale). */
export function toCelsius(value: number, unit: TemperatureUnit): number {
  return unit === "C" ? value : ((value - 32) * 5) / 9;
}

/** Wind to m/s. 1 mph = 0.44704 m/s and 1 knot = 1852/3600 m/s, both exact by definition. */
export function toMetresPerSecond(value: number, unit: WindUnit): number {
  switch (unit) {
    case "m/s":
      return value;
    case "km/h":
      return kmhToMs(value);
    case "mph":
      return value * 0.44704;
    case "knots":
      return (value * 1852) / 3600;
  }
}

/** Rain to mm; 1 in = 25.4 mm exactly. */
export function toMillimetres(value: number, unit: RainUnit): number {
  return unit === "mm" ? value : inchesToMm(value);
}

/**
 * Solar energy over a period, in MJ m⁻². A mean irradiance in W m⁻² over `periodS` seconds is
 * W × s / 10⁶ MJ (1 W = 1 J/s): a daily mean × 0.0864, an hourly mean × 0.0036 (FAO-56 ch. 3 conversion
 * factors). A value already in MJ m⁻² is the period's total.
 */
export function toSolarMJm2(value: number, unit: SolarUnit, periodS: number): number {
  return unit === "MJ/m2" ? value : (value * periodS) / 1e6;
}
