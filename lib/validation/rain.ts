import { z } from "zod";

const instant = () => z.iso.datetime({ offset: true, message: "Use an ISO instant with a zone, e.g. 2026-11-30T09:00:00+10:00" });
const localDate = () => z.iso.date({ message: "Use an ISO date, e.g. 2026-11-29" });
const note = () => z.string().trim().max(2000, "Use at most 2000 characters");
// A gauge overflows long before 1000 mm; the table's CHECK says why.
const readingDepthMm = () => z.number().min(0, "Rain is never negative").max(1000, "More than 1000 mm in a day is not a plausible reading");

/** A daily total read from a manual gauge. A trace (wet but under the gauge's resolution) counts as 0 mm. */
export const rainReadingSchema = z
  .object({
    id: z.uuid().optional(),
    gaugeId: z.uuid(),
    readAt: instant(),
    /** the day the rain is booked to; when absent it follows from readAt and the farm's boundary hour */
    rainDate: localDate().optional(),
    depthMm: readingDepthMm().optional(),
    trace: z.boolean().optional(),
    note: note().optional(),
  })
  .refine((r) => r.depthMm !== undefined || r.trace === true, {
    message: "Give the depth in mm, or mark the reading as a trace",
    path: ["depthMm"],
  });

export type RainReadingInput = z.infer<typeof rainReadingSchema>;

/** A correction of a reading; the reason goes into the audit log. */
export const rainReadingPatchSchema = z.object({
  readAt: instant().optional(),
  rainDate: localDate().optional(),
  depthMm: readingDepthMm().optional(),
  trace: z.boolean().optional(),
  note: note().nullable().optional(),
  reason: z.string().trim().min(1, "Say why the reading is corrected").max(500),
});

export type RainReadingPatch = z.infer<typeof rainReadingPatchSchema>;

export const rainReadingQuerySchema = z.object({
  from: localDate().optional(),
  to: localDate().optional(),
  gaugeId: z.uuid().optional(),
});

/** The most records one request may carry: a year of 1-hour logger intervals, or a long storm of tips. */
export const MAX_RAIN_RECORDS = 10_000;

export const rainRecordsSchema = z.object({
  gaugeId: z.uuid(),
  records: z
    .array(
      z.object({
        at: instant(),
        // The table's CHECK: zero is no record, 500 mm in one interval exceeds any storm burst.
        depthMm: z.number().gt(0, "A record is rain that fell: more than 0 mm").max(500, "At most 500 mm in one record"),
        intervalS: z.number().int().min(1).max(86_400, "A daily total belongs in a rain reading").optional(),
      }),
    )
    .min(1, "Send at least one record")
    .max(MAX_RAIN_RECORDS, `Send at most ${MAX_RAIN_RECORDS} records per request`),
});

export type RainRecordsInput = z.infer<typeof rainRecordsSchema>;

export const rainRecordQuerySchema = z.object({
  gaugeId: z.uuid().optional(),
  from: instant().optional(),
  to: instant().optional(),
});

/** The fields of a multipart reading (sent with a photo) as the JSON body would carry them. */
/**
 * The same reading sent as multipart/form-data with a photo: every field is text, read by
 * rainReadingFromForm and then checked by rainReadingSchema. Described here for the API document.
 */
export const rainReadingFormSchema = z.object({
  gaugeId: z.uuid(),
  readAt: z.string().describe("ISO instant with a zone, e.g. 2026-11-30T09:00:00+10:00"),
  rainDate: z.iso.date().optional(),
  depthMm: z.string().optional().describe("the depth in mm, as a number"),
  trace: z.enum(["true", "false"]).optional(),
  note: z.string().optional(),
  id: z.uuid().optional(),
  photo: z.file().max(10 * 1024 * 1024).mime(["image/jpeg", "image/png", "image/webp", "image/heic"]).optional(),
});

export function rainReadingFromForm(form: FormData): Record<string, unknown> {
  const text = (name: string): string | undefined => {
    const v = form.get(name);
    return typeof v === "string" && v.trim() !== "" ? v.trim() : undefined;
  };
  const depth = text("depthMm");
  const trace = text("trace");
  return {
    id: text("id"),
    gaugeId: text("gaugeId"),
    readAt: text("readAt"),
    rainDate: text("rainDate"),
    depthMm: depth === undefined ? undefined : Number(depth),
    trace: trace === undefined ? undefined : ["true", "on", "1", "yes"].includes(trace.toLowerCase()),
    note: text("note"),
  };
}
