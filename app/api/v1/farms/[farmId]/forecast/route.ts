import { z } from "zod";
import { forecastStations, weatherPreferObserved } from "@/db/forecast";
import { getFarm } from "@/db/farms";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";

const querySchema = z.object({ days: z.coerce.number().int().min(1).max(16).default(7) });

// GET /api/v1/farms/:farmId/forecast — the coming days per station, observed where measured, else forecast
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  const { days } = querySchema.parse({ days: new URL(req.url).searchParams.get("days") ?? undefined });
  const from = farmToday(farm.timeZone);
  const to = addDaysIso(from, days - 1);
  const stations = await forecastStations(farmId);
  return {
    from,
    to,
    stations: await Promise.all(
      stations.map(async (s) => ({
        stationId: s.id,
        name: s.name,
        days: await weatherPreferObserved(s.id, from, to),
      })),
    ),
  };
});
