import { z } from "zod";

export const FLAG_STATUSES = ["open", "accepted", "overridden"] as const;

const isoDate = z.iso.date();

export const flagQuerySchema = z.object({
  status: z.enum(FLAG_STATUSES).optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
});

/** Accept (the value counts) or override (set the value aside; say why). */
export const flagDecisionSchema = z
  .object({
    status: z.enum(["accepted", "overridden"]),
    reason: z.string().trim().max(1000).optional(),
  })
  .refine((d) => d.status !== "overridden" || (d.reason !== undefined && d.reason.length > 0), {
    path: ["reason"],
    message: "Say why the value is set aside",
  });

export type FlagDecision = z.infer<typeof flagDecisionSchema>;
