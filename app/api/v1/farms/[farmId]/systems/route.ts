import { createIrrigationSystem, listIrrigationSystems } from "@/db/irrigation-systems";
import { created, readJson, withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { irrigationSystemCreateSchema } from "@/lib/validation/irrigation-system";

// GET /api/v1/farms/:farmId/systems — the farm's irrigation systems (?includeArchived=true for all)
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const includeArchived = req.nextUrl.searchParams.get("includeArchived") === "true";
  const { rows, total } = await listIrrigationSystems(farmId, page, includeArchived);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/systems — add an irrigation system
export const POST = withFarmRole("editSetup", async ({ req, farmId, user }) => {
  const input = await readJson(req, irrigationSystemCreateSchema);
  const { system, created: isNew } = await createIrrigationSystem(farmId, user.id, input);
  return isNew ? created({ system }) : { system };
});
