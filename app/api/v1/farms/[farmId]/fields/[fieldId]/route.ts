import { archiveField, getField, updateField } from "@/db/fields";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { fieldPatchSchema } from "@/lib/validation/field";

type Params = { farmId: string; fieldId: string };

function fieldId(params: Params): string {
  if (!isUuid(params.fieldId)) throw new AppError("not_found", "No such field on this farm.");
  return params.fieldId;
}

// GET /api/v1/farms/:farmId/fields/:fieldId — one field
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const field = await getField(farmId, fieldId(params));
  if (!field) throw new AppError("not_found", "No such field on this farm.");
  return { field };
});

// PATCH /api/v1/farms/:farmId/fields/:fieldId — change a field
export const PATCH = withFarmRole<Params>("editSetup", async ({ req, farmId, params, user }) => {
  const id = fieldId(params);
  const patch = await readJson(req, fieldPatchSchema);
  const field = await updateField(farmId, user.id, id, patch);
  if (!field) throw new AppError("not_found", "No such field on this farm.");
  return { field };
});

// DELETE /api/v1/farms/:farmId/fields/:fieldId — archive a field (its records stay for the season statement)
export const DELETE = withFarmRole<Params>("editSetup", async ({ farmId, params, user }) => {
  if (!(await archiveField(farmId, user.id, fieldId(params)))) {
    throw new AppError("not_found", "No such field on this farm.");
  }
});
