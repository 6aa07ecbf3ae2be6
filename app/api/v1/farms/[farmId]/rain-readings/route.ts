import { createRainReading, listRainReadings, readingDay, requireFarm } from "@/db/rain";
import { AppError } from "@/lib/api/errors";
import { created, readJson } from "@/lib/api/handler";
import { readQuery, recomputeSoon, withFarmLogger } from "@/lib/api/logger-handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { fileStore } from "@/lib/storage";
import { MAX_PHOTO_BYTES, readPhoto } from "@/lib/storage/photos";
import { rainReadingFromForm, rainReadingQuerySchema, rainReadingSchema, type RainReadingInput } from "@/lib/validation/rain";

// The form's text fields and multipart framing around the photo stay well under this.
const MAX_FORM_OVERHEAD_BYTES = 256 * 1024;

async function readBody(req: Request): Promise<{ input: RainReadingInput; photo: File | null }> {
  if (!(req.headers.get("content-type") ?? "").startsWith("multipart/form-data")) {
    return { input: await readJson(req, rainReadingSchema), photo: null };
  }
  const tooLarge = new AppError("payload_too_large", "The photo is larger than 10 MB. Send a smaller or more compressed photo.", { photo: "At most 10 MB" });
  // Refuse an oversized upload before reading it, when the client says how big it is.
  const length = Number(req.headers.get("content-length") ?? "0");
  if (length > MAX_PHOTO_BYTES + MAX_FORM_OVERHEAD_BYTES) throw tooLarge;
  const form = await req.formData().catch(() => {
    // Next's proxy passes on only the first 10 MB of a body, so a cut-off form is an oversized one.
    throw length > MAX_PHOTO_BYTES ? tooLarge : new AppError("bad_request", "The form data could not be read.");
  });
  const photo = form.get("photo");
  return { input: rainReadingSchema.parse(rainReadingFromForm(form)), photo: photo instanceof File && photo.size > 0 ? photo : null };
}

// GET /api/v1/farms/:farmId/rain-readings — daily gauge readings, newest day first (?from&to&gaugeId, paginated)
export const GET = withFarmLogger("view", { tokens: false }, async ({ req, farmId }) => {
  const filter = readQuery(req, rainReadingQuerySchema);
  const page = pageQuery(req);
  const { rows, total } = await listRainReadings(farmId, filter, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/rain-readings — log a gauge reading (JSON, or multipart with a photo)
export const POST = withFarmLogger("log", { tokens: false }, async ({ req, farmId, author }) => {
  const { input, photo } = await readBody(req);
  const checkedPhoto = photo ? await readPhoto(photo) : null;
  const farm = await requireFarm(farmId);
  const stored: { key: string | null } = { key: null };
  const attach = checkedPhoto
    ? async (readingId: string) => {
        const key = `farms/${farmId}/rain-readings/${readingId}.${checkedPhoto.extension}`;
        await fileStore().put(key, checkedPhoto.data, checkedPhoto.type);
        stored.key = key;
        return key;
      }
    : undefined;
  try {
    const { reading, created: isNew } = await createRainReading(
      farmId,
      author,
      {
        id: input.id,
        gaugeId: input.gaugeId,
        readAt: input.readAt,
        rainDate: input.rainDate ?? readingDay(farm, input.readAt),
        depthMm: input.depthMm ?? 0,
        trace: input.trace ?? false,
        note: input.note ?? null,
      },
      attach,
    );
    if (!isNew) return { reading };
    await recomputeSoon(farmId);
    return created({ reading });
  } catch (err) {
    // The row rolled back, so its photo has nothing to belong to.
    if (stored.key) await fileStore().delete(stored.key).catch(() => undefined);
    throw err;
  }
});
