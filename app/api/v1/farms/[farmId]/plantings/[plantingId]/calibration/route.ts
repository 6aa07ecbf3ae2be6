import { updatePlanting } from "@/db/plantings";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { pathId } from "@/lib/agronomy/params";
import { calibratePlanting } from "@/lib/agronomy/what-if";
import { calibrationAcceptSchema } from "@/lib/validation/agronomy";

type Params = { farmId: string; plantingId: string };

// GET /api/v1/farms/:farmId/plantings/:plantingId/calibration — soil checks beside the modelled depletion, error statistics and a suggested Kc scale
export const GET = withFarmRole<Params>("editAgronomy", async ({ farmId, params }) =>
  calibratePlanting(farmId, pathId(params.plantingId, "planting")),
);

// POST /api/v1/farms/:farmId/plantings/:plantingId/calibration — accept a Kc scale with the reason; the account is recomputed from the planting date
export const POST = withFarmRole<Params>("editAgronomy", async ({ req, farmId, params, user }) => {
  const id = pathId(params.plantingId, "planting");
  const { kcScale, reason } = await readJson(req, calibrationAcceptSchema);
  const planting = await updatePlanting(farmId, user.id, id, { kcScale }, reason);
  if (!planting) throw new AppError("not_found", "No such planting on this farm.");
  return { planting, recompute: "queued" as const };
});
