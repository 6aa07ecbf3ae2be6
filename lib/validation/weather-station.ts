import { z } from "zod";
import { bothOrNeither, latitudeSchema, longitudeSchema } from "@/lib/geo/coordinates";
import { clientIdSchema, nameSchema, quantity } from "./farm";

export const weatherStationShape = {
  name: nameSchema("weather station"),
  latitude: latitudeSchema.nullable(),
  longitude: longitudeSchema.nullable(),
  elevationM: quantity("Elevation", { gte: -450, lte: 6000 }, "m", "height above sea level in metres").nullable(),
  windHeightM: quantity("Anemometer height", { gte: 0.5, lte: 100 }, "m", "2 m is the standard height"),
  coastal: z.boolean({ error: "Answer true or false" }),
};

export const weatherStationSchema = z.strictObject(weatherStationShape).superRefine(bothOrNeither);
export type WeatherStationValues = z.infer<typeof weatherStationSchema>;

export const weatherStationCreateSchema = z
  .strictObject({
    ...weatherStationShape,
    id: clientIdSchema,
    latitude: weatherStationShape.latitude.optional(),
    longitude: weatherStationShape.longitude.optional(),
    elevationM: weatherStationShape.elevationM.optional(),
    windHeightM: weatherStationShape.windHeightM.default(2),
    coastal: weatherStationShape.coastal.default(false),
  })
  .superRefine(bothOrNeither);
export type WeatherStationCreate = z.infer<typeof weatherStationCreateSchema>;

export const weatherStationPatchSchema = z.strictObject(weatherStationShape).partial();
export type WeatherStationPatch = z.infer<typeof weatherStationPatchSchema>;

/** Every value here enters reference ET (elevation: pressure; wind height: eq. 47; coastal: Rs). */
export const STATION_ACCOUNT_KEYS: readonly (keyof WeatherStationValues)[] = ["latitude", "longitude", "elevationM", "windHeightM", "coastal"];
