import { z } from "zod";
import { pageQuerySchema } from "@/lib/api/pagination";
import { apiTokenSchema } from "@/lib/validation/api-token";
import { irrigationEventPatchSchema, irrigationEventSchema } from "@/lib/validation/irrigation";
import {
  rainReadingPatchSchema,
  rainReadingQuerySchema,
  rainReadingFormSchema,
  rainReadingSchema,
  rainRecordQuerySchema,
  rainRecordsSchema,
} from "@/lib/validation/rain";
import { fieldDateQuerySchema, soilCheckPatchSchema, soilCheckSchema } from "@/lib/validation/soil-check";
import { weatherDaysSchema, weatherQuerySchema } from "@/lib/validation/weather";
import type { Operation } from "../types";

const FARM = "/api/v1/farms/{farmId}";
const page = (item: z.ZodType) =>
  z.object({ data: z.array(item), page: z.object({ limit: z.number(), offset: z.number(), total: z.number(), nextOffset: z.number().nullable() }) });
const paged = <T extends z.ZodObject>(q: T) => q.extend(pageQuerySchema.shape);

const reading = z.object({
  id: z.uuid(),
  gaugeId: z.uuid(),
  readAt: z.string(),
  rainDate: z.string(),
  depthMm: z.number(),
  trace: z.boolean(),
  hasPhoto: z.boolean(),
  note: z.string().nullable(),
  flagged: z.boolean(),
  flagReason: z.string().nullable(),
});
const batchResult = z.object({ inserted: z.number(), duplicates: z.number() });
const token = z.object({
  id: z.uuid(),
  name: z.string(),
  prefix: z.string(),
  gaugeIds: z.array(z.uuid()),
  stationIds: z.array(z.uuid()),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});

const RAIN = "Rain";
const WEATHER = "Weather";
const IRRIGATION = "Irrigation";
const SOIL = "Soil checks";
const TOKENS = "Logger tokens";

export const operations: Operation[] = [
  { method: "get", path: `${FARM}/rain-readings`, summary: "Daily gauge readings, newest day first", tag: RAIN, access: "view", query: paged(rainReadingQuerySchema), response: page(reading) },
  {
    method: "post",
    path: `${FARM}/rain-readings`,
    summary:
      "Log a gauge reading; a reading at the farm's boundary hour is booked to the day before unless rainDate is given. With a photo, send the same fields as multipart/form-data plus `photo` (JPEG, PNG, WebP or HEIC, at most 10 MB).",
    tag: RAIN,
    access: "log",
    body: rainReadingSchema,
    otherBodies: {
      "multipart/form-data": rainReadingFormSchema,
    },
    response: z.object({ reading }),
    status: 201,
  },
  { method: "get", path: `${FARM}/rain-readings/{readingId}`, summary: "One reading", tag: RAIN, access: "view", response: z.object({ reading }) },
  { method: "patch", path: `${FARM}/rain-readings/{readingId}`, summary: "Correct a reading, saying why", tag: RAIN, access: "log", body: rainReadingPatchSchema, response: z.object({ reading }) },
  { method: "delete", path: `${FARM}/rain-readings/{readingId}`, summary: "Remove a reading and its photo", tag: RAIN, access: "log", query: z.object({ reason: z.string().optional() }), status: 204 },
  { method: "get", path: `${FARM}/rain-readings/{readingId}/photo`, summary: "The photo taken with a reading (image bytes)", tag: RAIN, access: "view" },
  { method: "get", path: `${FARM}/rain-records`, summary: "Time-stamped rain records in time order", tag: RAIN, access: "view", query: paged(rainRecordQuerySchema) },
  {
    method: "post",
    path: `${FARM}/rain-records`,
    summary: "A batch of up to 10 000 tips or logger intervals; records already stored for the gauge and instant are counted as duplicates",
    tag: RAIN,
    access: "log+logger",
    body: rainRecordsSchema,
    response: batchResult,
  },
  { method: "get", path: `${FARM}/weather-days`, summary: "Weather station days in date order", tag: WEATHER, access: "view", query: paged(weatherQuerySchema) },
  {
    method: "post",
    path: `${FARM}/weather-days`,
    summary: "Observed or forecast days of a station, replacing stored days of the same date and kind",
    tag: WEATHER,
    access: "log+logger",
    body: weatherDaysSchema,
    response: z.object({ inserted: z.number(), updated: z.number() }),
  },
  { method: "get", path: `${FARM}/irrigation-events`, summary: "Irrigation events, latest first", tag: IRRIGATION, access: "view", query: paged(fieldDateQuerySchema) },
  {
    method: "post",
    path: `${FARM}/irrigation-events`,
    summary: "Log water applied: by gross or net depth, volume (m³), run hours × the system's flow, or meter readings (m³)",
    tag: IRRIGATION,
    access: "log",
    body: irrigationEventSchema,
    status: 201,
  },
  { method: "get", path: `${FARM}/irrigation-events/{eventId}`, summary: "One irrigation event", tag: IRRIGATION, access: "view" },
  { method: "patch", path: `${FARM}/irrigation-events/{eventId}`, summary: "Correct an irrigation event", tag: IRRIGATION, access: "log", body: irrigationEventPatchSchema },
  { method: "delete", path: `${FARM}/irrigation-events/{eventId}`, summary: "Remove an irrigation event", tag: IRRIGATION, access: "log", status: 204 },
  { method: "get", path: `${FARM}/soil-checks`, summary: "Soil checks, latest first", tag: SOIL, access: "view", query: paged(fieldDateQuerySchema) },
  { method: "post", path: `${FARM}/soil-checks`, summary: "Log a soil check (depletion in mm)", tag: SOIL, access: "log", body: soilCheckSchema, status: 201 },
  { method: "get", path: `${FARM}/soil-checks/{checkId}`, summary: "One soil check", tag: SOIL, access: "view" },
  { method: "patch", path: `${FARM}/soil-checks/{checkId}`, summary: "Correct a soil check", tag: SOIL, access: "log", body: soilCheckPatchSchema },
  { method: "delete", path: `${FARM}/soil-checks/{checkId}`, summary: "Remove a soil check", tag: SOIL, access: "log", status: 204 },
  { method: "get", path: `${FARM}/api-tokens`, summary: "The farm's logger tokens (never the secrets)", tag: TOKENS, access: "manageMembers", response: z.object({ data: z.array(token) }) },
  {
    method: "post",
    path: `${FARM}/api-tokens`,
    summary: "Make a logger token scoped to gauges and stations; the token is shown in this answer only",
    tag: TOKENS,
    access: "manageMembers",
    body: apiTokenSchema,
    response: z.object({ token: z.string(), apiToken: token }),
    status: 201,
  },
  { method: "delete", path: `${FARM}/api-tokens/{tokenId}`, summary: "Revoke a logger token", tag: TOKENS, access: "manageMembers", status: 204 },
];
