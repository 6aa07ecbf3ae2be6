import { z } from "zod";
import { pageQuerySchema } from "@/lib/api/pagination";
import { ROLES } from "@/lib/auth/roles";
import { cropCreateSchema, cropPatchSchema, cropShape } from "@/lib/validation/crop";
import { farmPatchSchema, UNIT_SYSTEMS } from "@/lib/validation/farm";
import { fieldCreateSchema, fieldPatchSchema, fieldShape } from "@/lib/validation/field";
import { gaugeCreateSchema, gaugePatchSchema, gaugeShape } from "@/lib/validation/gauge";
import {
  irrigationSystemCreateSchema,
  irrigationSystemPatchSchema,
  irrigationSystemShape,
} from "@/lib/validation/irrigation-system";
import { plantingCreateSchema, plantingPatchSchema, plantingShape } from "@/lib/validation/planting";
import { soilCreateSchema, soilPatchSchema, soilShape } from "@/lib/validation/soil";
import {
  weatherStationCreateSchema,
  weatherStationPatchSchema,
  weatherStationShape,
} from "@/lib/validation/weather-station";
import type { Operation } from "../types";

const stamps = { id: z.uuid(), createdAt: z.string(), updatedAt: z.string() };
const owned = { ...stamps, farmId: z.uuid() };
const archivable = { ...owned, archivedAt: z.string().nullable() };
const library = { ...stamps, farmId: z.uuid().nullable(), library: z.boolean() };

const soil = z.object({ ...soilShape, ...library });
const crop = z.object({ ...cropShape, ...library });
const system = z.object({ ...irrigationSystemShape, ...archivable });
const gauge = z.object({ ...gaugeShape, ...archivable });
const station = z.object({ ...weatherStationShape, ...archivable });
const field = z.object({
  ...fieldShape,
  ...archivable,
  centroidLat: z.number().nullable(),
  centroidLon: z.number().nullable(),
  accountDirtyFrom: z.string().nullable(),
});
const planting = z.object({ ...plantingShape, ...stamps });
const farm = z.object({
  id: z.uuid(),
  name: z.string(),
  timeZone: z.string(),
  unitSystem: z.enum(UNIT_SYSTEMS),
  latitude: z.number().nullable(),
  longitude: z.number().nullable(),
  elevationM: z.number().nullable(),
  rainDayBoundaryHour: z.number().int(),
  allocationMl: z.number().nullable(),
  carryoverMl: z.number(),
  waterYearStartMonth: z.number().int(),
  countFlaggedValues: z.boolean(),
});

function page<T extends z.ZodType>(item: T) {
  return z.object({
    data: z.array(item),
    page: z.object({ limit: z.number(), offset: z.number(), total: z.number(), nextOffset: z.number().nullable() }),
  });
}

const withArchived = pageQuerySchema.extend({ includeArchived: z.enum(["true", "false"]).optional() });

interface Resource {
  segment: string;
  param: string;
  key: string;
  noun: string;
  tag: string;
  write: Operation["access"];
  item: z.ZodType;
  create: z.ZodType;
  patch: z.ZodType;
  query: z.ZodType;
  remove: string;
}

/** List, create, read, change and remove for one set-up resource. */
function crud(r: Resource): Operation[] {
  const base = `/api/v1/farms/{farmId}/${r.segment}`;
  const one = z.object({ [r.key]: r.item });
  return [
    { method: "get", path: base, summary: `List ${r.noun}s`, tag: r.tag, access: "view", query: r.query, response: page(r.item) },
    { method: "post", path: base, summary: `Add a ${r.noun} (send your own uuid id to make a retry safe: a repeat answers 200 with the stored one)`, tag: r.tag, access: r.write, body: r.create, response: one, status: 201 },
    { method: "get", path: `${base}/{${r.param}}`, summary: `One ${r.noun}`, tag: r.tag, access: "view", response: one },
    { method: "patch", path: `${base}/{${r.param}}`, summary: `Change a ${r.noun}`, tag: r.tag, access: r.write, body: r.patch, response: one },
    { method: "delete", path: `${base}/{${r.param}}`, summary: r.remove, tag: r.tag, access: r.write, status: 204 },
  ];
}

export const operations: Operation[] = [
  {
    method: "patch",
    path: "/api/v1/farms/{farmId}",
    summary: "Change the farm's settings (editSetup) and allocation (editAllocation); parts the role may not change are refused with 403",
    tag: "Farms",
    access: "editSetup",
    body: farmPatchSchema,
    response: z.object({ farm, role: z.enum(ROLES) }),
  },
  ...crud({ segment: "soils", param: "soilId", key: "soil", noun: "soil", tag: "Soils and crops", write: "editAgronomy", item: soil, create: soilCreateSchema, patch: soilPatchSchema, query: pageQuerySchema, remove: "Delete a farm soil no field uses (library soils are read-only)" }),
  ...crud({ segment: "crops", param: "cropId", key: "crop", noun: "crop", tag: "Soils and crops", write: "editAgronomy", item: crop, create: cropCreateSchema, patch: cropPatchSchema, query: pageQuerySchema, remove: "Delete a farm crop no planting uses (library crops are read-only)" }),
  ...crud({ segment: "systems", param: "systemId", key: "system", noun: "irrigation system", tag: "Equipment", write: "editSetup", item: system, create: irrigationSystemCreateSchema, patch: irrigationSystemPatchSchema, query: withArchived, remove: "Archive an irrigation system" }),
  ...crud({ segment: "gauges", param: "gaugeId", key: "gauge", noun: "rain gauge", tag: "Equipment", write: "editSetup", item: gauge, create: gaugeCreateSchema, patch: gaugePatchSchema, query: withArchived, remove: "Archive a rain gauge" }),
  ...crud({ segment: "stations", param: "stationId", key: "station", noun: "weather station", tag: "Equipment", write: "editSetup", item: station, create: weatherStationCreateSchema, patch: weatherStationPatchSchema, query: withArchived, remove: "Archive a weather station" }),
  ...crud({ segment: "fields", param: "fieldId", key: "field", noun: "field", tag: "Fields", write: "editSetup", item: field, create: fieldCreateSchema, patch: fieldPatchSchema, query: withArchived, remove: "Archive a field" }),
  ...crud({ segment: "plantings", param: "plantingId", key: "planting", noun: "planting", tag: "Fields", write: "editAgronomy", item: planting, create: plantingCreateSchema, patch: plantingPatchSchema, query: pageQuerySchema.extend({ fieldId: z.uuid().optional() }), remove: "Delete a planting entered by mistake" }),
];
