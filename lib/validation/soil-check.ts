import { z } from "zod";

export const SOIL_CHECK_METHODS = ["probe", "feel", "sensor", "gravimetric"] as const;

const fields = {
  /** the local day the check applies to; when absent, the farm's date of checkedAt */
  date: z.iso.date({ message: "Use an ISO date, e.g. 2026-11-29" }),
  checkedAt: z.iso.datetime({ offset: true, message: "Use an ISO instant with a zone" }),
  // Depletion is water missing below field capacity; the table's CHECK bounds it.
  depletionMm: z.number().min(0, "Depletion is 0 at field capacity, never below").max(2000),
  method: z.enum(SOIL_CHECK_METHODS),
  depthM: z.number().gt(0, "The depth checked is more than 0 m").max(5),
  resetsAccount: z.boolean(),
  note: z.string().trim().max(2000),
};

/** A measured or estimated depletion; by default it resets the field's account to that value. */
export const soilCheckSchema = z
  .object({
    id: z.uuid().optional(),
    fieldId: z.uuid(),
    date: fields.date.optional(),
    checkedAt: fields.checkedAt.optional(),
    depletionMm: fields.depletionMm,
    method: fields.method,
    depthM: fields.depthM.optional(),
    resetsAccount: fields.resetsAccount.default(true),
    note: fields.note.optional(),
  })
  .refine((c) => c.date !== undefined || c.checkedAt !== undefined, { message: "Give the date or the time of the check", path: ["date"] });

export type SoilCheckInput = z.infer<typeof soilCheckSchema>;

export const soilCheckPatchSchema = z.object({
  date: fields.date.optional(),
  checkedAt: fields.checkedAt.optional(),
  depletionMm: fields.depletionMm.optional(),
  method: fields.method.optional(),
  depthM: fields.depthM.nullable().optional(),
  resetsAccount: fields.resetsAccount.optional(),
  note: fields.note.nullable().optional(),
  reason: z.string().trim().max(500).optional(),
});

export type SoilCheckPatch = z.infer<typeof soilCheckPatchSchema>;

export const fieldDateQuerySchema = z.object({
  fieldId: z.uuid().optional(),
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
});
