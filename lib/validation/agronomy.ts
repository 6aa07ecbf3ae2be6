import { z } from "zod";
import { changeReasonSchema } from "./crop";
import { plantingShape } from "./planting";

/** The values of a planting's crop curve the agronomy screen edits; null = the crop's own value. */
export const curveShape = {
  kcIni: plantingShape.kcIni,
  kcMid: plantingShape.kcMid,
  kcEnd: plantingShape.kcEnd,
  stageIniDays: plantingShape.stageIniDays,
  stageDevDays: plantingShape.stageDevDays,
  stageMidDays: plantingShape.stageMidDays,
  stageLateDays: plantingShape.stageLateDays,
  rootMinM: plantingShape.rootMinM,
  rootMaxM: plantingShape.rootMaxM,
  p: plantingShape.p,
  mad: plantingShape.mad,
  climateAdjust: plantingShape.climateAdjust,
  kcScale: plantingShape.kcScale,
};
export const CURVE_KEYS = Object.keys(curveShape) as (keyof typeof curveShape)[];

function rootsInOrder(v: { rootMinM?: number | null; rootMaxM?: number | null }, ctx: z.RefinementCtx): void {
  if (typeof v.rootMinM === "number" && typeof v.rootMaxM === "number" && v.rootMinM > v.rootMaxM) {
    ctx.addIssue({
      code: "custom",
      path: ["rootMinM"],
      message: "Initial root depth cannot be deeper than the maximum root depth",
    });
  }
}

/** Edited curve values for a what-if: only the keys sent change, nothing is stored. */
export const curveEditSchema = z.strictObject(curveShape).partial().superRefine(rootsInOrder);
export type CurveEdit = z.infer<typeof curveEditSchema>;

export const reasonSchema = changeReasonSchema;

/** Saving a tuned curve: the changes and why (required; it goes into the audit history). */
export const curveSaveSchema = z.strictObject({
  changes: curveEditSchema,
  reason: reasonSchema,
});
export type CurveSave = z.infer<typeof curveSaveSchema>;

/** Accepting a calibration: the factor to store and why. */
export const calibrationAcceptSchema = z.strictObject({
  kcScale: plantingShape.kcScale.unwrap(),
  reason: reasonSchema,
});
export type CalibrationAccept = z.infer<typeof calibrationAcceptSchema>;
