import { z } from "zod";
import { CURVE_NUMBER_TABLE, type RunoffCover } from "@/lib/waterbalance";
import { clientIdSchema, nameSchema, noteSchema, quantity } from "./farm";

export const RUNOFF_COVERS = Object.keys(CURVE_NUMBER_TABLE) as [RunoffCover, ...RunoffCover[]];

/** Crop coefficients: FAO-56 Table 12 stays below about 1.4; twice the grass reference is a typo. */
export const kcSchema = (label: string) => quantity(label, { gte: 0, lte: 2 }, "", "FAO-56 Table 12 values run 0.15-1.4");
export const stageDaysSchema = (label: string) => quantity(label, { int: true, gte: 0, lte: 1000 }, "days");
export const rootDepthSchema = (label: string) => quantity(label, { gt: 0, lte: 5 }, "m", "FAO-56 Table 22 gives 0.1-3 m");
export const pSchema = quantity("The depletion fraction p", { gte: 0.05, lte: 0.95 }, "", "FAO-56 Table 22 gives 0.2-0.75");
export const curveNumberSchema = quantity("The curve number", { gte: 30, lte: 100 }, "", "NRCS curve numbers run from about 30 to 100");

export const cropShape = {
  name: nameSchema("crop"),
  kcIni: kcSchema("Kc ini"),
  kcMid: kcSchema("Kc mid"),
  kcEnd: kcSchema("Kc end"),
  kcbIni: kcSchema("Kcb ini").nullable(),
  kcbMid: kcSchema("Kcb mid").nullable(),
  kcbEnd: kcSchema("Kcb end").nullable(),
  stageIniDays: stageDaysSchema("The initial stage"),
  stageDevDays: stageDaysSchema("The development stage"),
  stageMidDays: stageDaysSchema("The mid-season stage"),
  stageLateDays: stageDaysSchema("The late-season stage"),
  heightM: quantity("Crop height", { gt: 0, lte: 30 }, "m").nullable(),
  rootMinM: rootDepthSchema("Initial root depth"),
  rootMaxM: rootDepthSchema("Maximum root depth"),
  p: pSchema,
  curveNumber: curveNumberSchema.nullable(),
  runoffCover: z.enum(RUNOFF_COVERS, { error: `Choose a runoff cover: ${RUNOFF_COVERS.join(", ")}` }).nullable(),
  source: noteSchema,
  note: noteSchema,
};

const STAGES = ["stageIniDays", "stageDevDays", "stageMidDays", "stageLateDays"] as const;

function cropOrder(v: Partial<Record<keyof typeof cropShape, unknown>>, ctx: z.RefinementCtx): void {
  const n = (x: unknown) => (typeof x === "number" ? x : undefined);
  const min = n(v.rootMinM);
  const max = n(v.rootMaxM);
  if (min !== undefined && max !== undefined && min > max) {
    ctx.addIssue({ code: "custom", path: ["rootMinM"], message: "Initial root depth cannot be deeper than the maximum root depth" });
  }
  const days = STAGES.map((k) => n(v[k]));
  if (days.every((d) => d !== undefined)) {
    const total = days.reduce<number>((s, d) => s + (d ?? 0), 0);
    if (total < 1 || total > 1000) {
      ctx.addIssue({ code: "custom", path: ["stageIniDays"], message: "The four stages together must last 1 to 1000 days" });
    }
  }
}

/** A complete crop, as a row must be after a create or update is merged in. */
export const cropSchema = z.strictObject(cropShape).superRefine(cropOrder);
export type CropValues = z.infer<typeof cropSchema>;

export const cropCreateSchema = z
  .strictObject({
    ...z.object(cropShape).partial().shape,
    id: clientIdSchema,
    fromLibraryId: z.uuid("fromLibraryId must be the id of a library crop").optional(),
  })
  .superRefine(cropOrder);
export type CropCreate = z.infer<typeof cropCreateSchema>;

/** Why a farm's soil, crop or planting was changed; kept with the change in the audit history. */
export const changeReasonSchema = z
  .string({ error: "Say why the change is made" })
  .trim()
  .min(3, "Say why the change is made (at least 3 characters)")
  .max(500, "Keep the reason to 500 characters");

/** A change of a farm crop; `reason` (optional here) goes into the audit history, not the crop. */
export const cropPatchSchema = z.strictObject({ ...cropShape, reason: changeReasonSchema }).partial().superRefine(cropOrder);
export type CropPatch = z.infer<typeof cropPatchSchema>;

/** Values that feed the water account of every field planted with this crop. */
export const CROP_ACCOUNT_KEYS: readonly (keyof CropValues)[] = [
  "kcIni",
  "kcMid",
  "kcEnd",
  "kcbIni",
  "kcbMid",
  "kcbEnd",
  "stageIniDays",
  "stageDevDays",
  "stageMidDays",
  "stageLateDays",
  "heightM",
  "rootMinM",
  "rootMaxM",
  "p",
  "curveNumber",
  "runoffCover",
];
