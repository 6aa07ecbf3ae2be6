import { deleteRainReading, getRainReading, updateRainReading } from "@/db/rain";
import { AppError } from "@/lib/api/errors";
import { readJson } from "@/lib/api/handler";
import { pathId, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { fileStore } from "@/lib/storage";
import { rainReadingPatchSchema } from "@/lib/validation/rain";

type P = { farmId: string; readingId: string };

// GET /api/v1/farms/:farmId/rain-readings/:readingId — one reading
export const GET = withFarmLogger<P>("view", { tokens: false }, async ({ farmId, params }) => {
  const reading = await getRainReading(farmId, pathId(params.readingId, "rain reading"));
  if (!reading) throw new AppError("not_found", "No such rain reading.");
  return { reading };
});

// PATCH /api/v1/farms/:farmId/rain-readings/:readingId — correct a reading, saying why
export const PATCH = withFarmLogger<P>("log", { tokens: false }, async ({ req, farmId, params, author }) => {
  const id = pathId(params.readingId, "rain reading");
  const patch = await readJson(req, rainReadingPatchSchema);
  const reading = await updateRainReading(farmId, author, id, patch);
  await recomputeSoon(farmId);
  return { reading };
});

// DELETE /api/v1/farms/:farmId/rain-readings/:readingId — remove a reading and its photo (?reason=)
export const DELETE = withFarmLogger<P>("log", { tokens: false }, async ({ req, farmId, params, author }) => {
  const reason = new URL(req.url).searchParams.get("reason")?.slice(0, 500) || undefined;
  const { photoKey } = await deleteRainReading(farmId, author, pathId(params.readingId, "rain reading"), reason);
  await recomputeSoon(farmId);
  // After the commit: a photo left behind by a failed removal is only wasted space, never a dangling row.
  if (photoKey) await fileStore().delete(photoKey).catch((err: unknown) => console.error("photo not removed:", err));
});
