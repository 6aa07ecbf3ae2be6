import { db } from "@/db/knex";
import { withFarmRole } from "@/lib/api/handler";
import { farmPlan } from "@/lib/accounts/outlook";
import { outlookQuerySchema, searchParams } from "@/lib/accounts/queries";
import { farmToday } from "@/lib/farm-time";

// GET /api/v1/farms/:farmId/plan — the next days' irrigations across fields, ordered by urgency within shared pump capacity
export const GET = withFarmRole("view", async ({ req, farmId }) => {
  const query = outlookQuerySchema.parse(searchParams(req));
  const farm = (await db("farms").where({ id: farmId }).first("time_zone")) as { time_zone: string };
  const startDate = farmToday(farm.time_zone);
  const plan = await farmPlan(farmId, startDate, query.days, query.forecastRain);
  return {
    startDate,
    days: query.days,
    irrigations: plan?.irrigations ?? [],
    notDue: plan?.notDue ?? [],
    shortfallDays: plan?.shortfallDays ?? [],
    capacities: plan?.capacities ?? [],
    estimate: true,
  };
});
