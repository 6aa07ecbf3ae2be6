import { z } from "zod";
import { latitudeSchema, longitudeSchema } from "@/lib/geo/coordinates";

/*
 * The farm's own settings, and the small builders every set-up schema (soils, crops, fields, ...) uses so
 * that a number out of range says which quantity, which unit and which range, in a farm team's words.
 */

interface Range {
  gt?: number;
  gte?: number;
  lt?: number;
  lte?: number;
  int?: boolean;
}

/** A number within a physical range, with messages that name the quantity (`label`) and its unit. */
export function quantity(label: string, range: Range, unit = "", hint = ""): z.ZodNumber {
  const u = unit ? ` ${unit}` : "";
  const h = hint ? ` (${hint})` : "";
  let s = z.number({ error: (iss) => (iss.input === undefined ? `Enter ${label.toLowerCase()}` : `${label} must be a number${u ? ` in${u}` : ""}`) });
  if (range.int) s = s.int(`${label} must be a whole number${u}`);
  if (range.gt !== undefined) s = s.gt(range.gt, `${label} must be more than ${range.gt}${u}${h}`);
  if (range.gte !== undefined) s = s.gte(range.gte, `${label} must be at least ${range.gte}${u}${h}`);
  if (range.lt !== undefined) s = s.lt(range.lt, `${label} must be less than ${range.lt}${u}${h}`);
  if (range.lte !== undefined) s = s.lte(range.lte, `${label} must be at most ${range.lte}${u}${h}`);
  return s;
}

/** A short name, trimmed, as shown on the farm map and in lists. */
export function nameSchema(what: string) {
  return z
    .string({ error: `Enter a name for the ${what}` })
    .trim()
    .min(1, `Enter a name for the ${what}`)
    .max(120, "Keep the name to 120 characters");
}

/** Free text such as a note or a source; empty means none. */
export const noteSchema = z
  .string()
  .trim()
  .max(2000, "Keep it to 2000 characters")
  .transform((s) => (s.length ? s : null))
  .nullable();

/** A client-chosen uuid for a new row, so an offline submission sent twice is stored once. */
export const clientIdSchema = z.uuid("The id must be a UUID (leave it out and the server picks one)").optional();

/** True when the runtime's time-zone database knows `zone` (IANA names like Australia/Sydney). */
export function isTimeZone(zone: string): boolean {
  if (!zone.includes("/") && zone !== "UTC") return false;
  try {
    new Intl.DateTimeFormat("en", { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

export const UNIT_SYSTEMS = ["metric", "imperial"] as const;

/** What PATCH /farms/:farmId may change, with the capability each part needs. */
export const farmSetupSchema = z.strictObject({
  name: nameSchema("farm"),
  timeZone: z
    .string()
    .trim()
    .refine(isTimeZone, "Use a time zone name like Australia/Sydney or America/Fresno (IANA time zone database)"),
  unitSystem: z.enum(UNIT_SYSTEMS, { error: "Units are metric or imperial" }),
  latitude: latitudeSchema.nullable(),
  longitude: longitudeSchema.nullable(),
  elevationM: quantity("Elevation", { gte: -450, lte: 6000 }, "m", "height above sea level in metres").nullable(),
  rainDayBoundaryHour: quantity("The rain-day boundary hour", { int: true, gte: 0, lte: 23 }, "", "the hour rain gauges are read, 0-23; 9 is common"),
  countFlaggedValues: z.boolean({ error: "Answer true or false" }),
});

export const farmAllocationSchema = z.strictObject({
  allocationMl: quantity("The allocation", { gte: 0 }, "ML").nullable(),
  carryoverMl: quantity("The carryover", { gte: 0 }, "ML"),
  waterYearStartMonth: quantity("The water year's first month", { int: true, gte: 1, lte: 12 }, "", "1 = January, 7 = July"),
});

export const farmPatchSchema = z
  .strictObject({ ...farmSetupSchema.shape, ...farmAllocationSchema.shape })
  .partial()
  .superRefine((v, ctx) => {
    if ((v.latitude === null) !== (v.longitude === null)) {
      ctx.addIssue({ code: "custom", message: "Clear both latitude and longitude, or neither", path: ["latitude"] });
    }
  });

export type FarmPatch = z.infer<typeof farmPatchSchema>;
export const SETUP_KEYS = Object.keys(farmSetupSchema.shape) as (keyof FarmPatch)[];
export const ALLOCATION_KEYS = Object.keys(farmAllocationSchema.shape) as (keyof FarmPatch)[];
