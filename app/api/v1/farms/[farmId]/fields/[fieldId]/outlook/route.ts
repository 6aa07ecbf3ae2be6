import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";
import { fieldOutlook } from "@/lib/accounts/outlook";
import { outlookQuerySchema, searchParams } from "@/lib/accounts/queries";

// GET /api/v1/farms/:farmId/fields/:fieldId/outlook — the account projected forward: when the field is due, how much, how long
export const GET = withFarmRole<{ farmId: string; fieldId: string }>("view", async ({ req, params, farmId }) => {
  const query = outlookQuerySchema.parse(searchParams(req));
  const fieldId = z.uuid().safeParse(params.fieldId);
  if (!fieldId.success) throw new AppError("not_found", "No such field on this farm.");
  const outlook = await fieldOutlook(farmId, fieldId.data, query.days, query.forecastRain);
  if (outlook === "no-field") throw new AppError("not_found", "No such field on this farm.");
  if (outlook === "no-account") throw new AppError("conflict", "The field has no stored account yet (it needs a soil, a planting and weather).");
  return { ...outlook, estimate: true };
});
