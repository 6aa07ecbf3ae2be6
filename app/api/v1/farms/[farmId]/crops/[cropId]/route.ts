import { deleteCrop, getCrop, updateCrop } from "@/db/crops";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { cropPatchSchema } from "@/lib/validation/crop";

type Params = { farmId: string; cropId: string };

function cropId(params: Params): string {
  if (!isUuid(params.cropId)) throw new AppError("not_found", "No such crop on this farm.");
  return params.cropId;
}

// GET /api/v1/farms/:farmId/crops/:cropId — one crop of the farm or of the library
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const crop = await getCrop(farmId, cropId(params));
  if (!crop) throw new AppError("not_found", "No such crop on this farm.");
  return { crop };
});

// PATCH /api/v1/farms/:farmId/crops/:cropId — change a farm crop (library crops are read-only)
export const PATCH = withFarmRole<Params>("editAgronomy", async ({ req, farmId, params, user }) => {
  const id = cropId(params);
  const patch = await readJson(req, cropPatchSchema);
  const crop = await updateCrop(farmId, user.id, id, patch);
  if (!crop) throw new AppError("not_found", "No such crop on this farm.");
  return { crop };
});

// DELETE /api/v1/farms/:farmId/crops/:cropId — delete a farm crop no planting uses
export const DELETE = withFarmRole<Params>("editAgronomy", async ({ farmId, params, user }) => {
  if (!(await deleteCrop(farmId, user.id, cropId(params)))) throw new AppError("not_found", "No such crop on this farm.");
});
