import { z } from "zod";
import { statementQuerySchema, statementSelectionShape, statementSendSchema } from "@/lib/validation/statement";
import type { Operation } from "../types";

const quantity = z.object({ depthMm: z.number(), volumeM3: z.number(), volumeMl: z.number(), volumeAcreFt: z.number() });
const lines = z.object({
  rain: quantity,
  runoff: quantity,
  effectiveRain: quantity,
  irrigationGross: quantity,
  applicationLoss: quantity,
  irrigationNet: quantity,
  capillaryRise: quantity,
  etc: quantity,
  etActual: quantity,
  deepPercolation: quantity,
  storageChange: quantity,
});
const totals = z.object({ areaHa: z.number(), fieldDays: z.number(), lastDate: z.iso.date().nullable(), lines, closure: quantity });
const period = z.union([
  z.object({ kind: z.literal("water-year"), year: z.number(), label: z.string(), from: z.iso.date(), to: z.iso.date() }),
  z.object({ kind: z.literal("season"), season: z.string(), from: z.iso.date(), to: z.iso.date() }),
]);
const statement = z.object({
  farm: z.object({ id: z.uuid(), name: z.string(), waterYearStartMonth: z.number() }),
  field: z.object({ id: z.uuid(), name: z.string(), areaHa: z.number() }).nullable(),
  period,
  madeOn: z.iso.date(),
  totals,
  fields: z.array(totals.extend({ fieldId: z.uuid(), name: z.string(), fieldAreaHa: z.number() })),
  months: z.array(z.object({ month: z.string(), fieldDays: z.number(), lines })),
  allocation: z.object({
    waterYear: z.number(),
    label: z.string(),
    from: z.iso.date(),
    to: z.iso.date(),
    allocationMl: z.number().nullable(),
    carryoverMl: z.number(),
    limitMl: z.number().nullable(),
    usedMl: z.number(),
    shareUsed: z.number().nullable(),
    level: z.enum(["no-limit", "within", "approaching", "reached"]),
    months: z.array(z.object({ month: z.string(), useM3: z.number().nullable(), cumulativeMl: z.number().nullable(), shareOfLimit: z.number().nullable() })),
  }),
  productivity: z.array(
    z.object({
      plantingId: z.uuid(),
      fieldId: z.uuid(),
      fieldName: z.string(),
      cropName: z.string(),
      season: z.string(),
      areaHa: z.number(),
      yieldTHa: z.number().nullable(),
      irrigationGrossM3: z.number(),
      etActualM3: z.number(),
      yieldKg: z.number().nullable(),
      kgPerM3Irrigation: z.number().nullable(),
      kgPerM3Et: z.number().nullable(),
    }),
  ),
  choices: z.object({
    fields: z.array(z.object({ id: z.uuid(), name: z.string(), areaHa: z.number(), archived: z.boolean() })),
    waterYears: z.array(z.object({ year: z.number(), label: z.string() })),
    seasons: z.array(z.object({ season: z.string(), from: z.iso.date(), to: z.iso.date().nullable() })),
  }),
  estimate: z.literal(true),
});
const selection = z.object(statementSelectionShape);

export const operations: Operation[] = [
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/statement",
    summary: "The season water statement of the farm or a field, for a water year or a crop season: totals in mm, m³, ML and acre-feet, the balance's closure, allocation use by month, water productivity (estimates)",
    tag: "Statement",
    access: "readStatement",
    query: statementQuerySchema,
    response: statement,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/statement.csv",
    summary: "The season water statement as CSV (one value per row; section, item, units in the column names)",
    tag: "Statement",
    access: "readStatement",
    query: selection,
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/statement.pdf",
    summary: "The season water statement as an A4 PDF",
    tag: "Statement",
    access: "readStatement",
    query: selection,
  },
  {
    method: "post",
    path: "/api/v1/farms/{farmId}/statement/send",
    summary: "E-mail the statement as a PDF to the sender, or to another member of the farm",
    tag: "Statement",
    access: "readStatement",
    body: statementSendSchema,
    response: z.object({ sent: z.literal(true), to: z.email(), filename: z.string(), bytes: z.number() }),
  },
];
