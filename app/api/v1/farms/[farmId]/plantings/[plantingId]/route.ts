import { deletePlanting, getPlanting, updatePlanting } from "@/db/plantings";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { plantingPatchSchema } from "@/lib/validation/planting";

type Params = { farmId: string; plantingId: string };

function plantingId(params: Params): string {
  if (!isUuid(params.plantingId)) throw new AppError("not_found", "No such planting on this farm.");
  return params.plantingId;
}

// GET /api/v1/farms/:farmId/plantings/:plantingId — one planting with its overrides
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const planting = await getPlanting(farmId, plantingId(params));
  if (!planting) throw new AppError("not_found", "No such planting on this farm.");
  return { planting };
});

// PATCH /api/v1/farms/:farmId/plantings/:plantingId — change a planting's crop, dates or overrides
export const PATCH = withFarmRole<Params>("editAgronomy", async ({ req, farmId, params, user }) => {
  const id = plantingId(params);
  const patch = await readJson(req, plantingPatchSchema);
  const planting = await updatePlanting(farmId, user.id, id, patch);
  if (!planting) throw new AppError("not_found", "No such planting on this farm.");
  return { planting };
});

// DELETE /api/v1/farms/:farmId/plantings/:plantingId — remove a planting entered by mistake
export const DELETE = withFarmRole<Params>("editAgronomy", async ({ farmId, params, user }) => {
  if (!(await deletePlanting(farmId, user.id, plantingId(params)))) throw new AppError("not_found", "No such planting on this farm.");
});
