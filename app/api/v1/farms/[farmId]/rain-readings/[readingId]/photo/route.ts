import { readingPhotoKey } from "@/db/rain";
import { AppError } from "@/lib/api/errors";
import { pathId, withFarmLogger } from "@/lib/api/logger-handler";
import { fileStore } from "@/lib/storage";

// GET /api/v1/farms/:farmId/rain-readings/:readingId/photo — the photo taken with a reading
export const GET = withFarmLogger<{ farmId: string; readingId: string }>("view", { tokens: false }, async ({ farmId, params }) => {
  const key = await readingPhotoKey(farmId, pathId(params.readingId, "rain reading"));
  if (key === undefined) throw new AppError("not_found", "No such rain reading.");
  const file = key ? await fileStore().get(key) : undefined;
  if (!file) throw new AppError("not_found", "This reading has no photo.");
  return new Response(Buffer.from(file.data), {
    headers: {
      "content-type": file.contentType,
      "content-length": String(file.data.byteLength),
      // Members only: a shared cache must not keep it, and the browser must not guess another type.
      "cache-control": "private, max-age=3600",
      "x-content-type-options": "nosniff",
      "content-disposition": "inline",
    },
  });
});
