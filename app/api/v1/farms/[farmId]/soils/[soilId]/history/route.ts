import { listHistory } from "@/db/agronomy";
import { withFarmRole } from "@/lib/api/handler";
import { pathId } from "@/lib/agronomy/params";

type Params = { farmId: string; soilId: string };

// GET /api/v1/farms/:farmId/soils/:soilId/history — who changed the farm's soil, when, why, with the values before and after
export const GET = withFarmRole<Params>("editAgronomy", async ({ farmId, params }) => ({
  data: await listHistory(farmId, "soil", pathId(params.soilId, "soil")),
}));
