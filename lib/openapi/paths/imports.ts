import { z } from "zod";
import { IMPORT_KINDS, importFormSchema } from "@/lib/imports/options";
import { flagDecisionSchema, flagQuerySchema, FLAG_STATUSES } from "@/lib/qc/validation";
import type { Operation } from "../types";

const page = z.object({
  limit: z.number(),
  offset: z.number(),
  total: z.number(),
  nextOffset: z.number().nullable(),
});
const problem = z.object({
  line: z.number(),
  column: z.string(),
  value: z.string().optional(),
  reason: z.string(),
});
const importRecord = z.object({
  id: z.uuid(),
  farmId: z.uuid(),
  kind: z.enum(IMPORT_KINDS),
  fileName: z.string(),
  sizeBytes: z.number(),
  fileHash: z.string(),
  options: z.unknown(),
  status: z.enum(["processing", "done", "rejected", "failed"]),
  progress: z.number().min(0).max(1),
  counts: z.object({
    rows: z.number(),
    accepted: z.number(),
    rejected: z.number(),
    inserted: z.number(),
    updated: z.number(),
    unchanged: z.number(),
  }),
  report: z
    .object({
      unit: z.enum(["line", "feature"]),
      rejected: z.array(problem),
      warnings: z.array(z.string()),
      written: z.boolean(),
      dateRange: z.object({ from: z.string(), to: z.string() }).optional(),
      qc: z.object({ flagsOpened: z.number() }).optional(),
    })
    .nullable(),
  createdBy: z.uuid().nullable(),
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
});
const flag = z.object({
  id: z.uuid(),
  farmId: z.uuid(),
  entity: z.enum(["rain_reading", "rain_record", "weather_day"]),
  entityId: z.string(),
  date: z.string(),
  rule: z.string(),
  message: z.string(),
  status: z.enum(FLAG_STATUSES),
  reason: z.string().nullable(),
  decidedBy: z.uuid().nullable(),
  decidedAt: z.string().nullable(),
  createdAt: z.string(),
});
const weatherDay = z.object({
  id: z.uuid(),
  stationId: z.uuid(),
  date: z.string(),
  kind: z.enum(["observed", "forecast"]),
  tmaxC: z.number().nullable(),
  tminC: z.number().nullable(),
  rhMaxPct: z.number().nullable(),
  rhMinPct: z.number().nullable(),
  rhMeanPct: z.number().nullable(),
  windMs: z.number().nullable(),
  solarMJm2: z.number().nullable(),
  rainMm: z.number().nullable(),
  source: z.string().nullable(),
  flagged: z.boolean(),
  flagReason: z.string().nullable(),
});
const pageQuery = z.object({ limit: z.number().int().optional(), offset: z.number().int().optional() });

export const operations: Operation[] = [
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/imports",
    summary: "Past imports, newest first, with their reports",
    tag: "Imports",
    access: "log",
    query: pageQuery,
    response: z.object({ data: z.array(importRecord), page }),
  },
  {
    method: "post",
    path: "/api/v1/farms/{farmId}/imports",
    summary:
      "Import a file (at most 20 MB): weather station CSV (daily or sub-daily, aggregated to days), rain logger CSV, manual gauge readings CSV, or field boundaries (GeoJSON, KML, zipped shapefile; needs editSetup). 201 when processed, 202 when under way (poll the import), 200 when the same file was imported before; 413 when too large. Every rejected row is reported with line, column and reason; unless options.writeGoodRows, nothing is written when any row is rejected.",
    tag: "Imports",
    access: "log",
    body: importFormSchema,
    bodyContentType: "multipart/form-data",
    response: importRecord.extend({ repeat: z.boolean() }),
    status: 201,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/imports/{importId}",
    summary: "One import: status, progress (0-1), counts and report",
    tag: "Imports",
    access: "log",
    response: importRecord,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/flags",
    summary: "Quality-control flags on rain and weather values",
    tag: "Quality control",
    access: "log",
    query: flagQuerySchema.extend(pageQuery.shape),
    response: z.object({ data: z.array(flag), page }),
  },
  {
    method: "patch",
    path: "/api/v1/farms/{farmId}/flags/{flagId}",
    summary: "Accept a flagged value (it counts) or override it with a reason (it is set aside)",
    tag: "Quality control",
    access: "editAgronomy",
    body: flagDecisionSchema,
    response: flag,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/forecast",
    summary: "The coming days per weather station: observed where measured, else forecast",
    tag: "Forecast",
    access: "view",
    query: z.object({ days: z.number().int().min(1).max(16).optional() }),
    response: z.object({
      from: z.string(),
      to: z.string(),
      stations: z.array(z.object({ stationId: z.uuid(), name: z.string(), days: z.array(weatherDay) })),
    }),
  },
  {
    method: "post",
    path: "/api/v1/farms/{farmId}/forecast/refresh",
    summary:
      "Fetch the forecast now for the farm's stations, replacing earlier forecast days (observed days are kept)",
    tag: "Forecast",
    access: "log",
    response: z.object({
      from: z.string(),
      to: z.string(),
      stations: z.array(
        z.object({ stationId: z.uuid(), name: z.string(), days: z.number(), replaced: z.number() }),
      ),
    }),
  },
];
