import { z } from "zod";
import { boundarySchema } from "@/lib/geo/boundary";
import { curveNumberSchema } from "./crop";
import { clientIdSchema, nameSchema, quantity } from "./farm";

const ref = (what: string) => z.uuid(`Choose a ${what} by its id`).nullable();

export const fieldShape = {
  name: nameSchema("field"),
  boundary: boundarySchema.nullable(),
  // 100 000 ha is a county, not a field: larger is a units slip (m² typed as ha).
  areaHa: quantity("Area", { gt: 0, lte: 100_000 }, "ha"),
  soilId: ref("soil"),
  slopePct: quantity("Slope", { gte: 0, lte: 100 }, "%", "rise over run; 100 % is 45°").nullable(),
  irrigationSystemId: ref("irrigation system"),
  gaugeId: ref("rain gauge"),
  curveNumber: curveNumberSchema.nullable(),
};

/**
 * With a boundary the area is computed from it; without one the team types the area. Both at once could
 * disagree, so that is refused rather than one silently ignored.
 */
function areaOrBoundary(v: { boundary?: unknown; areaHa?: unknown }, ctx: z.RefinementCtx, creating: boolean): void {
  const hasBoundary = v.boundary !== undefined && v.boundary !== null;
  if (hasBoundary && v.areaHa !== undefined) {
    ctx.addIssue({ code: "custom", path: ["areaHa"], message: "The area is computed from the boundary: send one or the other" });
  }
  if (creating && !hasBoundary && v.areaHa === undefined) {
    ctx.addIssue({ code: "custom", path: ["boundary"], message: "Draw or upload the field's boundary, or enter its area in hectares" });
  }
}

export const fieldCreateSchema = z
  .strictObject({
    id: clientIdSchema,
    name: fieldShape.name,
    boundary: fieldShape.boundary.optional(),
    areaHa: fieldShape.areaHa.optional(),
    soilId: fieldShape.soilId.optional(),
    slopePct: fieldShape.slopePct.optional(),
    irrigationSystemId: fieldShape.irrigationSystemId.optional(),
    gaugeId: fieldShape.gaugeId.optional(),
    curveNumber: fieldShape.curveNumber.optional(),
  })
  .superRefine((v, ctx) => areaOrBoundary(v, ctx, true));
export type FieldCreate = z.infer<typeof fieldCreateSchema>;

export const fieldPatchSchema = z
  .strictObject(fieldShape)
  .partial()
  .superRefine((v, ctx) => areaOrBoundary(v, ctx, false));
export type FieldPatch = z.infer<typeof fieldPatchSchema>;

/** A field's values that its water account is computed from (boundary: its centroid picks rain gauges). */
export const FIELD_ACCOUNT_KEYS = ["soilId", "slopePct", "irrigationSystemId", "gaugeId", "curveNumber", "boundary"] as const;
