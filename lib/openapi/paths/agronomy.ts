import { z } from "zod";
import { plantingShape } from "@/lib/validation/planting";
import { calibrationAcceptSchema, curveEditSchema, curveSaveSchema } from "@/lib/validation/agronomy";
import type { Operation } from "../types";

const planting = z.object({ ...plantingShape, id: z.uuid(), createdAt: z.string(), updatedAt: z.string() });
const previewDay = z.object({
  date: z.iso.date(),
  depletionMm: z.number(),
  tawMm: z.number(),
  rawMm: z.number(),
  triggerMm: z.number(),
  kc: z.number(),
});
const kcUsed = z
  .object({
    ini: z.number(),
    mid: z.number(),
    end: z.number(),
    adjusted: z.boolean(),
    midWindMs: z.number().nullable(),
    midRhMinPct: z.number().nullable(),
    endWindMs: z.number().nullable(),
    endRhMinPct: z.number().nullable(),
  })
  .nullable();
const history = z.object({
  data: z.array(
    z.object({
      id: z.string(),
      at: z.string(),
      action: z.string(),
      actor: z.string(),
      userName: z.string().nullable(),
      userEmail: z.string().nullable(),
      reason: z.string().nullable(),
      before: z.record(z.string(), z.unknown()).nullable(),
      after: z.record(z.string(), z.unknown()).nullable(),
    }),
  ),
});
const stats = z.object({
  n: z.number(),
  meanErrorMm: z.number().nullable(),
  rmseMm: z.number().nullable(),
  maeMm: z.number().nullable(),
});
const saved = z.object({ planting, recompute: z.literal("queued") });

export const operations: Operation[] = [
  {
    method: "post",
    path: "/api/v1/farms/{farmId}/plantings/{plantingId}/preview",
    summary:
      "What-if: the season's account re-run with an edited crop curve, beside the saved one (stores nothing; an estimate)",
    tag: "Agronomy",
    access: "editAgronomy",
    body: curveEditSchema,
    response: z.object({
      plantingId: z.uuid(),
      from: z.iso.date().nullable(),
      to: z.iso.date().nullable(),
      saved: z.array(previewDay),
      edited: z.array(previewDay),
      kcUsed: z.object({ saved: kcUsed, edited: kcUsed }),
      daysAtOrPastTrigger: z.object({ saved: z.number(), edited: z.number() }),
      estimate: z.literal(true),
    }),
  },
  {
    method: "post",
    path: "/api/v1/farms/{farmId}/plantings/{plantingId}/curve",
    summary:
      "Save a tuned crop curve with the reason; audited with the values before and after, the account recomputed from the planting date",
    tag: "Agronomy",
    access: "editAgronomy",
    body: curveSaveSchema,
    response: saved,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/plantings/{plantingId}/history",
    summary: "A planting's changes, newest first: who, when, why, values before and after",
    tag: "Agronomy",
    access: "editAgronomy",
    response: history,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/plantings/{plantingId}/calibration",
    summary:
      "Soil checks beside the modelled depletion, error statistics and a least-squares Kc scale (an estimate)",
    tag: "Agronomy",
    access: "editAgronomy",
    response: z.object({
      plantingId: z.uuid(),
      kcScale: z.number(),
      checks: z.array(
        z.object({
          id: z.uuid(),
          date: z.iso.date(),
          observedMm: z.number(),
          modelledMm: z.number(),
          errorMm: z.number(),
          method: z.string(),
          resetsAccount: z.boolean(),
        }),
      ),
      unmatched: z.number(),
      stats,
      suggestion: z.object({
        scale: z.number().nullable(),
        withScale: stats.nullable(),
        evaluations: z.number(),
        method: z.string(),
      }),
      estimate: z.literal(true),
    }),
  },
  {
    method: "post",
    path: "/api/v1/farms/{farmId}/plantings/{plantingId}/calibration",
    summary: "Accept a Kc scale with the reason; audited, the account recomputed from the planting date",
    tag: "Agronomy",
    access: "editAgronomy",
    body: calibrationAcceptSchema,
    response: saved,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/crops/{cropId}/history",
    summary: "A farm crop's changes, newest first: who, when, why, values before and after",
    tag: "Agronomy",
    access: "editAgronomy",
    response: history,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/soils/{soilId}/history",
    summary: "A farm soil's changes, newest first: who, when, why, values before and after",
    tag: "Agronomy",
    access: "editAgronomy",
    response: history,
  },
];
