import { z } from "zod";
import { kcSchema, pSchema, rootDepthSchema, stageDaysSchema } from "./crop";
import { clientIdSchema, noteSchema, quantity } from "./farm";

/** An ISO calendar date that exists (2026-02-30 does not), within the years a season could be. */
export const isoDateSchema = (label: string) =>
  z
    .string({ error: `Enter ${label.toLowerCase()} as YYYY-MM-DD` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${label} must be a date written YYYY-MM-DD`)
    .refine((s) => {
      const d = new Date(`${s}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
    }, `${label} is not a date on the calendar`)
    .refine((s) => s >= "1900-01-01" && s <= "2199-12-31", `${label} must fall between 1900 and 2199`);

export const plantingShape = {
  fieldId: z.uuid("Choose the field by its id"),
  season: z.string({ error: "Name the season, e.g. 2026-27" }).trim().min(1, "Name the season, e.g. 2026-27").max(40, "Keep the season's name to 40 characters"),
  cropId: z.uuid("Choose the crop by its id"),
  plantingDate: isoDateSchema("The planting date"),
  endDate: isoDateSchema("The end date").nullable(),
  // Overrides of the crop's values for this field and season; null = the crop's own value.
  kcIni: kcSchema("Kc ini").nullable(),
  kcMid: kcSchema("Kc mid").nullable(),
  kcEnd: kcSchema("Kc end").nullable(),
  stageIniDays: stageDaysSchema("The initial stage").nullable(),
  stageDevDays: stageDaysSchema("The development stage").nullable(),
  stageMidDays: stageDaysSchema("The mid-season stage").nullable(),
  stageLateDays: stageDaysSchema("The late-season stage").nullable(),
  rootMinM: rootDepthSchema("Initial root depth").nullable(),
  rootMaxM: rootDepthSchema("Maximum root depth").nullable(),
  p: pSchema.nullable(),
  mad: quantity("The trigger (MAD)", { gt: 0, lt: 1 }, "", "a share of the total available water, e.g. 0.5").nullable(),
  climateAdjust: z.boolean({ error: "Answer true or false" }),
  // A calibration's factor on Kc ini, mid and end; null = the curve as given.
  kcScale: quantity("The Kc scale", { gte: 0.5, lte: 2 }, "", "1 = the curve as given; a calibration suggests it").nullable(),
  initialDepletionMm: quantity("Initial depletion", { gte: 0, lte: 2000 }, "mm", "0 = at field capacity on the planting date"),
  note: noteSchema,
  /** harvested yield, t/ha; null until weighed. Only the season statement reads it. */
  yieldTHa: quantity("The yield", { gte: 0, lte: 1000 }, "t/ha", "as harvested, e.g. 12.5").nullable(),
};

function datesInOrder(v: { plantingDate?: unknown; endDate?: unknown }, ctx: z.RefinementCtx): void {
  if (typeof v.plantingDate === "string" && typeof v.endDate === "string" && v.endDate < v.plantingDate) {
    ctx.addIssue({ code: "custom", path: ["endDate"], message: "The end date cannot be before the planting date" });
  }
}

export const plantingSchema = z.strictObject(plantingShape).superRefine(datesInOrder);
export type PlantingValues = z.infer<typeof plantingSchema>;

const optional = Object.fromEntries(
  Object.entries(plantingShape).map(([k, s]) => [k, s.optional()]),
) as { [K in keyof typeof plantingShape]: z.ZodOptional<(typeof plantingShape)[K]> };

export const plantingCreateSchema = z
  .strictObject({
    ...optional,
    id: clientIdSchema,
    fieldId: plantingShape.fieldId,
    season: plantingShape.season,
    cropId: plantingShape.cropId,
    plantingDate: plantingShape.plantingDate,
  })
  .superRefine(datesInOrder);
export type PlantingCreate = z.infer<typeof plantingCreateSchema>;

export const plantingPatchSchema = z.strictObject(plantingShape).omit({ fieldId: true }).partial().superRefine(datesInOrder);
export type PlantingPatch = z.infer<typeof plantingPatchSchema>;

/** Everything but the season's label, the note and the yield changes the account. */
export const PLANTING_ACCOUNT_KEYS = Object.keys(plantingShape).filter((k) => k !== "season" && k !== "note" && k !== "fieldId" && k !== "yieldTHa");
