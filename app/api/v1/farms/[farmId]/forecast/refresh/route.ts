import { withFarmRole } from "@/lib/api/handler";
import { refreshForecast } from "@/lib/forecast/refresh";

// POST /api/v1/farms/:farmId/forecast/refresh — fetch the coming days' forecast for the farm's stations now
export const POST = withFarmRole("log", async ({ farmId, user }) =>
  refreshForecast(farmId, { userId: user.id }),
);
