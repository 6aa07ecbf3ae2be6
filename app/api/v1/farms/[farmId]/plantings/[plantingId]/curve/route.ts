import { updatePlanting } from "@/db/plantings";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { pathId } from "@/lib/agronomy/params";
import { curveSaveSchema } from "@/lib/validation/agronomy";

type Params = { farmId: string; plantingId: string };

// POST /api/v1/farms/:farmId/plantings/:plantingId/curve — save a tuned crop curve with the reason; the account is recomputed from the planting date
export const POST = withFarmRole<Params>("editAgronomy", async ({ req, farmId, params, user }) => {
  const id = pathId(params.plantingId, "planting");
  const { changes, reason } = await readJson(req, curveSaveSchema);
  if (Object.keys(changes).length === 0)
    throw new AppError("invalid", "Nothing to save: change a value first.", { changes: "No value changed" });
  const planting = await updatePlanting(farmId, user.id, id, changes, reason);
  if (!planting) throw new AppError("not_found", "No such planting on this farm.");
  return { planting, recompute: "queued" as const };
});
