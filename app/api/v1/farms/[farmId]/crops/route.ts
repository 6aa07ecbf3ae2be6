import { listCrops, createCrop } from "@/db/crops";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { cropCreateSchema } from "@/lib/validation/crop";

// GET /api/v1/farms/:farmId/crops — the farm's own crops, then the published library's (library: true)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const { rows, total } = await listCrops(farmId, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/crops — add a farm crop, or a copy of a library crop to tune
export const POST = withFarmRole("editAgronomy", async ({ req, farmId, user }) => {
  const input = await readJson(req, cropCreateSchema);
  const { crop, created: isNew } = await createCrop(farmId, user.id, input);
  return isNew ? created({ crop }) : { crop };
});
