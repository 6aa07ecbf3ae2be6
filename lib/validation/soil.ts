import { z } from "zod";
import { SOIL_TEXTURES, type TextureId } from "@/lib/waterbalance";
import { changeReasonSchema } from "./crop";
import { clientIdSchema, nameSchema, noteSchema, quantity } from "./farm";

/** The engine's texture ids (lib/waterbalance/soils.ts); the database refuses any other. */
export const TEXTURE_IDS = SOIL_TEXTURES.map((t) => t.id) as [TextureId, ...TextureId[]];

const waterContent = (label: string) =>
  quantity(label, { gt: 0, lte: 1 }, "m³/m³", "a share of the soil's volume, e.g. 0.30");

/** Every value a soil row holds, camelCase, units in the names. */
export const soilShape = {
  name: nameSchema("soil"),
  texture: z.enum(TEXTURE_IDS, { error: `Choose a texture class: ${TEXTURE_IDS.join(", ")}` }),
  thetaFc: waterContent("Water content at field capacity"),
  thetaWp: waterContent("Water content at wilting point"),
  thetaSat: waterContent("Water content at saturation"),
  rewMm: quantity("Readily evaporable water", { gte: 0, lte: 100 }, "mm", "FAO-56 Table 19 gives 2-12 mm").nullable(),
  tewMm: quantity("Total evaporable water", { gt: 0, lte: 100 }, "mm", "FAO-56 Table 19 gives 6-29 mm").nullable(),
  gaSuctionMm: quantity("Wetting-front suction", { gt: 0, lte: 2000 }, "mm", "Rawls et al. give about 50-320 mm").nullable(),
  gaKsatMmH: quantity("Saturated hydraulic conductivity", { gt: 0, lte: 1000 }, "mm/h").nullable(),
  gaPorosity: quantity("Porosity", { gt: 0, lte: 1 }, "m³/m³").nullable(),
  gaEffectivePorosity: quantity("Effective porosity", { gt: 0, lte: 1 }, "m³/m³").nullable(),
  hydrologicGroup: z.enum(["A", "B", "C", "D"], { error: "The hydrologic soil group is A, B, C or D" }).nullable(),
  source: noteSchema,
  note: noteSchema,
};

type Ctx = z.RefinementCtx;

function soilOrder(v: Partial<Record<keyof typeof soilShape, unknown>>, ctx: Ctx): void {
  const n = (x: unknown) => (typeof x === "number" ? x : undefined);
  const fc = n(v.thetaFc);
  const wp = n(v.thetaWp);
  const sat = n(v.thetaSat);
  if (fc !== undefined && wp !== undefined && wp >= fc) {
    ctx.addIssue({ code: "custom", path: ["thetaWp"], message: "Wilting point must hold less water than field capacity" });
  }
  if (fc !== undefined && sat !== undefined && fc >= sat) {
    ctx.addIssue({ code: "custom", path: ["thetaFc"], message: "Field capacity must hold less water than saturation" });
  }
  const rew = n(v.rewMm);
  const tew = n(v.tewMm);
  if (rew !== undefined && tew !== undefined && rew > tew) {
    ctx.addIssue({ code: "custom", path: ["rewMm"], message: "Readily evaporable water is part of the total evaporable water, so it cannot exceed it" });
  }
  const por = n(v.gaPorosity);
  const eff = n(v.gaEffectivePorosity);
  if (por !== undefined && eff !== undefined && eff > por) {
    ctx.addIssue({ code: "custom", path: ["gaEffectivePorosity"], message: "Effective porosity cannot exceed the total porosity" });
  }
}

/** A complete soil: what a row must satisfy after a create or an update is merged in. */
export const soilSchema = z.strictObject(soilShape).superRefine(soilOrder);
export type SoilValues = z.infer<typeof soilSchema>;

/**
 * POST body: a texture alone gives its published defaults; `fromLibraryId` copies a library soil; any
 * value sent overrides what it starts from.
 */
export const soilCreateSchema = z
  .strictObject({
    ...z.object(soilShape).partial().shape,
    id: clientIdSchema,
    fromLibraryId: z.uuid("fromLibraryId must be the id of a library soil").optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.fromLibraryId && !v.texture) {
      ctx.addIssue({ code: "custom", path: ["texture"], message: "Choose a texture class, or copy a library soil with fromLibraryId" });
    }
    soilOrder(v, ctx);
  });
export type SoilCreate = z.infer<typeof soilCreateSchema>;

/** A change of a farm soil; `reason` (optional here) goes into the audit history, not the soil. */
export const soilPatchSchema = z.strictObject({ ...soilShape, reason: changeReasonSchema }).partial().superRefine(soilOrder);
export type SoilPatch = z.infer<typeof soilPatchSchema>;

/** The values that change a field's water account when they change. */
export const SOIL_ACCOUNT_KEYS: readonly (keyof SoilValues)[] = [
  "texture",
  "thetaFc",
  "thetaWp",
  "thetaSat",
  "rewMm",
  "tewMm",
  "gaSuctionMm",
  "gaKsatMmH",
  "gaPorosity",
  "gaEffectivePorosity",
  "hydrologicGroup",
];
