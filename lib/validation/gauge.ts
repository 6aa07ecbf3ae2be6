import { z } from "zod";
import { bothOrNeither, latitudeSchema, longitudeSchema } from "@/lib/geo/coordinates";
import { clientIdSchema, nameSchema, quantity } from "./farm";

export const GAUGE_KINDS = ["manual", "recording"] as const;

export const gaugeShape = {
  name: nameSchema("rain gauge"),
  kind: z.enum(GAUGE_KINDS, { error: "A gauge is manual (read by hand) or recording (tipping bucket or logger)" }),
  latitude: latitudeSchema.nullable(),
  longitude: longitudeSchema.nullable(),
  resolutionMm: quantity("Resolution", { gt: 0, lte: 5 }, "mm", "a tipping bucket's tip is usually 0.2 mm").nullable(),
};

export const gaugeSchema = z.strictObject(gaugeShape).superRefine(bothOrNeither);
export type GaugeValues = z.infer<typeof gaugeSchema>;

export const gaugeCreateSchema = z
  .strictObject({
    ...gaugeShape,
    id: clientIdSchema,
    latitude: gaugeShape.latitude.optional(),
    longitude: gaugeShape.longitude.optional(),
    resolutionMm: gaugeShape.resolutionMm.optional(),
  })
  .superRefine(bothOrNeither);
export type GaugeCreate = z.infer<typeof gaugeCreateSchema>;

export const gaugePatchSchema = z.strictObject(gaugeShape).partial();
export type GaugePatch = z.infer<typeof gaugePatchSchema>;

/** Moving a gauge changes which fields its rain is shared with (inverse-distance weights). */
export const GAUGE_ACCOUNT_KEYS: readonly (keyof GaugeValues)[] = ["latitude", "longitude", "kind"];
