import { archiveGauge, getGauge, updateGauge } from "@/db/gauges";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { gaugePatchSchema } from "@/lib/validation/gauge";

type Params = { farmId: string; gaugeId: string };

function gaugeId(params: Params): string {
  if (!isUuid(params.gaugeId)) throw new AppError("not_found", "No such rain gauge on this farm.");
  return params.gaugeId;
}

// GET /api/v1/farms/:farmId/gauges/:gaugeId — one rain gauge
export const GET = withFarmRole<Params>("view", async ({ farmId, params }) => {
  const gauge = await getGauge(farmId, gaugeId(params));
  if (!gauge) throw new AppError("not_found", "No such rain gauge on this farm.");
  return { gauge };
});

// PATCH /api/v1/farms/:farmId/gauges/:gaugeId — change a rain gauge
export const PATCH = withFarmRole<Params>("editSetup", async ({ req, farmId, params, user }) => {
  const id = gaugeId(params);
  const patch = await readJson(req, gaugePatchSchema);
  const gauge = await updateGauge(farmId, user.id, id, patch);
  if (!gauge) throw new AppError("not_found", "No such rain gauge on this farm.");
  return { gauge };
});

// DELETE /api/v1/farms/:farmId/gauges/:gaugeId — archive a rain gauge (its readings stay in past accounts)
export const DELETE = withFarmRole<Params>("editSetup", async ({ farmId, params, user }) => {
  if (!(await archiveGauge(farmId, user.id, gaugeId(params)))) {
    throw new AppError("not_found", "No such rain gauge on this farm.");
  }
});
