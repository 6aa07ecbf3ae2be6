import { createField, listFields } from "@/db/fields";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { fieldCreateSchema } from "@/lib/validation/field";

// GET /api/v1/farms/:farmId/fields — the farm's fields with boundaries (?includeArchived=true for all)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const includeArchived = req.nextUrl.searchParams.get("includeArchived") === "true";
  const { rows, total } = await listFields(farmId, page, includeArchived);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/fields — add a field (boundary GeoJSON, or an area in ha)
export const POST = withFarmRole("editSetup", async ({ req, farmId, user }) => {
  const input = await readJson(req, fieldCreateSchema);
  const { field, created: isNew } = await createField(farmId, user.id, input);
  return isNew ? created({ field }) : { field };
});
