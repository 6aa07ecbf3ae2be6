import { listSoils, createSoil } from "@/db/soils";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { soilCreateSchema } from "@/lib/validation/soil";

// GET /api/v1/farms/:farmId/soils — the farm's own soils, then the published library's (library: true)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const { rows, total } = await listSoils(farmId, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/soils — add a farm soil from a texture class or a copy of a library soil
export const POST = withFarmRole("editAgronomy", async ({ req, farmId, user }) => {
  const input = await readJson(req, soilCreateSchema);
  const { soil, created: isNew } = await createSoil(farmId, user.id, input);
  return isNew ? created({ soil }) : { soil };
});
