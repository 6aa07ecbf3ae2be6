import { createPlanting, listPlantings } from "@/db/plantings";
import { AppError } from "@/lib/api/errors";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { isUuid } from "@/lib/auth/session";
import { plantingCreateSchema } from "@/lib/validation/planting";

// GET /api/v1/farms/:farmId/plantings — the farm's plantings, latest first (?fieldId= for one field)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const fieldId = req.nextUrl.searchParams.get("fieldId") ?? undefined;
  if (fieldId !== undefined && !isUuid(fieldId)) {
    throw new AppError("invalid", "Some values are not valid.", { fieldId: "Choose the field by its id" });
  }
  const { rows, total } = await listPlantings(farmId, page, fieldId);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/plantings — plant a crop in a field for a season, with per-field overrides
export const POST = withFarmRole("editAgronomy", async ({ req, farmId, user }) => {
  const input = await readJson(req, plantingCreateSchema);
  const { planting, created: isNew } = await createPlanting(farmId, user.id, input);
  return isNew ? created({ planting }) : { planting };
});
