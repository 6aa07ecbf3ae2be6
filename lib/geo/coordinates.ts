import { z } from "zod";

/** Latitude in decimal degrees, WGS84. */
export const latitudeSchema = z
  .number({ error: "Enter the latitude in decimal degrees (e.g. -34.45)" })
  .min(-90, "Latitude runs from -90 (South Pole) to 90 (North Pole)")
  .max(90, "Latitude runs from -90 (South Pole) to 90 (North Pole)");

/** Longitude in decimal degrees, WGS84. */
export const longitudeSchema = z
  .number({ error: "Enter the longitude in decimal degrees (e.g. 146.04)" })
  .min(-180, "Longitude runs from -180 to 180 (east of Greenwich is positive)")
  .max(180, "Longitude runs from -180 to 180 (east of Greenwich is positive)");

/**
 * Adds a "give both or neither" check for a latitude/longitude pair: half a location puts a gauge or
 * station on the equator or the prime meridian without anyone noticing.
 */
export function bothOrNeither(
  value: { latitude?: number | null; longitude?: number | null },
  ctx: { addIssue: (issue: { code: "custom"; message: string; path: string[] }) => void },
): void {
  const hasLat = value.latitude !== undefined && value.latitude !== null;
  const hasLon = value.longitude !== undefined && value.longitude !== null;
  if (hasLat !== hasLon) {
    ctx.addIssue({
      code: "custom",
      message: "Give both latitude and longitude, or neither",
      path: [hasLat ? "longitude" : "latitude"],
    });
  }
}
