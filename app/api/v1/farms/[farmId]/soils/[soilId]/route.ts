import { deleteSoil, getSoil, updateSoil } from "@/db/soils";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { soilPatchSchema } from "@/lib/validation/soil";

type Params = { farmId: string; soilId: string };

function soilId(params: Params): string {
  if (!isUuid(params.soilId)) throw new AppError("not_found", "No such soil on this farm.");
  return params.soilId;
}

// GET /api/v1/farms/:farmId/soils/:soilId — one soil of the farm or of the library
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const soil = await getSoil(farmId, soilId(params));
  if (!soil) throw new AppError("not_found", "No such soil on this farm.");
  return { soil };
});

// PATCH /api/v1/farms/:farmId/soils/:soilId — change a farm soil (library soils are read-only)
export const PATCH = withFarmRole<Params>("editAgronomy", async ({ req, farmId, params, user }) => {
  const id = soilId(params);
  const patch = await readJson(req, soilPatchSchema);
  const soil = await updateSoil(farmId, user.id, id, patch);
  if (!soil) throw new AppError("not_found", "No such soil on this farm.");
  return { soil };
});

// DELETE /api/v1/farms/:farmId/soils/:soilId — delete a farm soil no field uses
export const DELETE = withFarmRole<Params>("editAgronomy", async ({ farmId, params, user }) => {
  if (!(await deleteSoil(farmId, user.id, soilId(params)))) throw new AppError("not_found", "No such soil on this farm.");
});
