import { readJson, withFarmRole } from "@/lib/api/handler";
import { pathId } from "@/lib/agronomy/params";
import { previewCurve } from "@/lib/agronomy/what-if";
import { curveEditSchema } from "@/lib/validation/agronomy";

type Params = { farmId: string; plantingId: string };

// POST /api/v1/farms/:farmId/plantings/:plantingId/preview — the season's account re-run with an edited crop curve, beside the saved one; stores nothing
export const POST = withFarmRole<Params>("editAgronomy", async ({ req, farmId, params }) => {
  const id = pathId(params.plantingId, "planting");
  const edit = await readJson(req, curveEditSchema);
  return previewCurve(farmId, id, edit);
});
