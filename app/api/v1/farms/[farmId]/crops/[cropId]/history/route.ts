import { listHistory } from "@/db/agronomy";
import { withFarmRole } from "@/lib/api/handler";
import { pathId } from "@/lib/agronomy/params";

type Params = { farmId: string; cropId: string };

// GET /api/v1/farms/:farmId/crops/:cropId/history — who changed the farm's crop, when, why, with the values before and after
export const GET = withFarmRole<Params>("editAgronomy", async ({ farmId, params }) => ({
  data: await listHistory(farmId, "crop", pathId(params.cropId, "crop")),
}));
