import { deleteIrrigationEvent, getIrrigationEvent, updateIrrigationEvent } from "@/db/irrigation";
import { AppError } from "@/lib/api/errors";
import { readJson } from "@/lib/api/handler";
import { pathId, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { irrigationEventPatchSchema } from "@/lib/validation/irrigation";

type P = { farmId: string; eventId: string };

// GET /api/v1/farms/:farmId/irrigation-events/:eventId — one irrigation event
export const GET = withFarmLogger<P>("view", { tokens: false }, async ({ farmId, params }) => {
  const event = await getIrrigationEvent(farmId, pathId(params.eventId, "irrigation event"));
  if (!event) throw new AppError("not_found", "No such irrigation event.");
  return { event };
});

// PATCH /api/v1/farms/:farmId/irrigation-events/:eventId — correct an event; amounts are worked out again
export const PATCH = withFarmLogger<P>("log", { tokens: false }, async ({ req, farmId, params, author }) => {
  const id = pathId(params.eventId, "irrigation event");
  const event = await updateIrrigationEvent(farmId, author, id, await readJson(req, irrigationEventPatchSchema));
  await recomputeSoon(farmId);
  return { event };
});

// DELETE /api/v1/farms/:farmId/irrigation-events/:eventId — remove an event logged by mistake
export const DELETE = withFarmLogger<P>("log", { tokens: false }, async ({ farmId, params, author }) => {
  await deleteIrrigationEvent(farmId, author, pathId(params.eventId, "irrigation event"));
  await recomputeSoon(farmId);
});
