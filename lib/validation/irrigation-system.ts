import { z } from "zod";
import { clientIdSchema, nameSchema, quantity } from "./farm";

/** Kinds of irrigation system (the database lists the same). */
export const SYSTEM_KINDS = ["drip", "micro", "pivot", "linear", "solid_set", "hand_move", "traveller", "furrow", "flood"] as const;

export const irrigationSystemShape = {
  name: nameSchema("irrigation system"),
  kind: z.enum(SYSTEM_KINDS, { error: `Choose a kind of system: ${SYSTEM_KINDS.join(", ")}` }),
  applicationEfficiency: quantity(
    "Application efficiency",
    { gt: 0, lte: 1 },
    "",
    "the share of pumped water that reaches the root zone, e.g. 0.85 for 85 %",
  ),
  flowM3H: quantity("Flow", { gt: 0, lte: 100_000 }, "m³/h").nullable(),
  capacityMmDay: quantity("System capacity", { gt: 0, lte: 500 }, "mm/day", "the depth the system can apply in 24 hours").nullable(),
  depthPerPassMm: quantity("Depth per pass", { gt: 0, lte: 100 }, "mm").nullable(),
  pumpName: z.string().trim().max(120, "Keep the pump's name to 120 characters").transform((s) => (s.length ? s : null)).nullable(),
};

export const irrigationSystemSchema = z.strictObject(irrigationSystemShape);
export type IrrigationSystemValues = z.infer<typeof irrigationSystemSchema>;

export const irrigationSystemCreateSchema = z.strictObject({
  ...irrigationSystemShape,
  id: clientIdSchema,
  flowM3H: irrigationSystemShape.flowM3H.optional(),
  capacityMmDay: irrigationSystemShape.capacityMmDay.optional(),
  depthPerPassMm: irrigationSystemShape.depthPerPassMm.optional(),
  pumpName: irrigationSystemShape.pumpName.optional(),
});
export type IrrigationSystemCreate = z.infer<typeof irrigationSystemCreateSchema>;

export const irrigationSystemPatchSchema = irrigationSystemSchema.partial();
export type IrrigationSystemPatch = z.infer<typeof irrigationSystemPatchSchema>;

/** Values a field's account uses: net irrigation is gross times efficiency. */
export const SYSTEM_ACCOUNT_KEYS: readonly (keyof IrrigationSystemValues)[] = ["applicationEfficiency"];
