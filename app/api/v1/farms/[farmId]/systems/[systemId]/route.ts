import { archiveIrrigationSystem, getIrrigationSystem, updateIrrigationSystem } from "@/db/irrigation-systems";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { irrigationSystemPatchSchema } from "@/lib/validation/irrigation-system";

type Params = { farmId: string; systemId: string };

function systemId(params: Params): string {
  if (!isUuid(params.systemId)) throw new AppError("not_found", "No such irrigation system on this farm.");
  return params.systemId;
}

// GET /api/v1/farms/:farmId/systems/:systemId — one irrigation system
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const system = await getIrrigationSystem(farmId, systemId(params));
  if (!system) throw new AppError("not_found", "No such irrigation system on this farm.");
  return { system };
});

// PATCH /api/v1/farms/:farmId/systems/:systemId — change an irrigation system
export const PATCH = withFarmRole<Params>("editSetup", async ({ req, farmId, params, user }) => {
  const id = systemId(params);
  const patch = await readJson(req, irrigationSystemPatchSchema);
  const system = await updateIrrigationSystem(farmId, user.id, id, patch);
  if (!system) throw new AppError("not_found", "No such irrigation system on this farm.");
  return { system };
});

// DELETE /api/v1/farms/:farmId/systems/:systemId — archive an irrigation system (past events keep naming it)
export const DELETE = withFarmRole<Params>("editSetup", async ({ farmId, params, user }) => {
  if (!(await archiveIrrigationSystem(farmId, user.id, systemId(params)))) {
    throw new AppError("not_found", "No such irrigation system on this farm.");
  }
});
