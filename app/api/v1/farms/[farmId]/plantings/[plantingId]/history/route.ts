import { listHistory } from "@/db/agronomy";
import { withFarmRole } from "@/lib/api/handler";
import { pathId } from "@/lib/agronomy/params";

type Params = { farmId: string; plantingId: string };

// GET /api/v1/farms/:farmId/plantings/:plantingId/history — who changed the planting, when, why, with the values before and after
export const GET = withFarmRole<Params>("editAgronomy", async ({ farmId, params }) => ({
  data: await listHistory(farmId, "planting", pathId(params.plantingId, "planting")),
}));
