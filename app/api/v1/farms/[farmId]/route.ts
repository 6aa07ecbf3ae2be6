import { getFarm } from "@/db/farms";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";

// GET /api/v1/farms/:farmId — one farm's settings
export const GET = withFarmRole("view", async ({ farmId, role }) => {
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  return { farm, role };
});
