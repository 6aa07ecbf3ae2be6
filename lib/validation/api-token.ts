import { z } from "zod";

export const apiTokenSchema = z
  .object({
    name: z.string().trim().min(1, "Give the token a name, e.g. the logger it is for").max(80, "Use at most 80 characters"),
    gaugeIds: z.array(z.uuid()).max(100).default([]),
    stationIds: z.array(z.uuid()).max(100).default([]),
  })
  .refine((t) => t.gaugeIds.length + t.stationIds.length > 0, {
    message: "Choose at least one gauge or weather station the token may post for",
    path: ["gaugeIds"],
  });

export type ApiTokenInput = z.infer<typeof apiTokenSchema>;
