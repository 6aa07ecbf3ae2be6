import { getFarm, updateFarm } from "@/db/farms";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { ALLOCATION_KEYS, farmPatchSchema, SETUP_KEYS } from "@/lib/validation/farm";

// GET /api/v1/farms/:farmId — one farm's settings
export const GET = withFarmRole("view", async ({ farmId, role }) => {
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  return { farm, role };
});

// PATCH /api/v1/farms/:farmId — change the farm's settings (editSetup) and its allocation (editAllocation)
export const PATCH = withFarmRole("view", async ({ req, farmId, user, role }) => {
  // Refuse before reading the body: a role that may change no part of the farm learns nothing from it.
  if (!can(role, "editSetup") && !can(role, "editAllocation")) {
    throw new AppError("forbidden", "Your role on this farm does not allow changing its settings.");
  }
  const patch = await readJson(req, farmPatchSchema);
  const sent = Object.keys(patch) as (keyof typeof patch)[];
  const refused = [
    ...(can(role, "editSetup") ? [] : sent.filter((k) => SETUP_KEYS.includes(k))),
    ...(can(role, "editAllocation") ? [] : sent.filter((k) => ALLOCATION_KEYS.includes(k))),
  ];
  if (refused.length > 0) {
    throw new AppError(
      "forbidden",
      "Your role on this farm does not allow changing some of these settings.",
      Object.fromEntries(refused.map((k) => [k, "Your role may not change this"])),
    );
  }
  const farm = await updateFarm(farmId, user.id, patch);
  if (!farm) throw new AppError("not_found", "No such farm.");
  return { farm, role };
});
