import { deleteSoilCheck, getSoilCheck, updateSoilCheck } from "@/db/soil-checks";
import { AppError } from "@/lib/api/errors";
import { readJson } from "@/lib/api/handler";
import { pathId, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { soilCheckPatchSchema } from "@/lib/validation/soil-check";

type P = { farmId: string; checkId: string };

// GET /api/v1/farms/:farmId/soil-checks/:checkId — one soil check
export const GET = withFarmLogger<P>("view", { tokens: false }, async ({ farmId, params }) => {
  const check = await getSoilCheck(farmId, pathId(params.checkId, "soil check"));
  if (!check) throw new AppError("not_found", "No such soil check.");
  return { check };
});

// PATCH /api/v1/farms/:farmId/soil-checks/:checkId — correct a soil check
export const PATCH = withFarmLogger<P>("log", { tokens: false }, async ({ req, farmId, params, author }) => {
  const id = pathId(params.checkId, "soil check");
  const check = await updateSoilCheck(farmId, author, id, await readJson(req, soilCheckPatchSchema));
  await recomputeSoon(farmId);
  return { check };
});

// DELETE /api/v1/farms/:farmId/soil-checks/:checkId — remove a soil check logged by mistake
export const DELETE = withFarmLogger<P>("log", { tokens: false }, async ({ farmId, params, author }) => {
  await deleteSoilCheck(farmId, author, pathId(params.checkId, "soil check"));
  await recomputeSoon(farmId);
});
