import { z } from "zod";
import { AppError } from "@/lib/api/errors";

export const IRRIGATION_METHODS = ["depth", "volume", "hours", "meter"] as const;
export type IrrigationMethod = (typeof IRRIGATION_METHODS)[number];

/** Which inputs each way of logging needs; the others are dropped when the method changes. */
export const QUANTITY_KEYS = ["grossDepthMm", "netDepthMm", "volumeM3", "hours", "meterStart", "meterEnd"] as const;

const instant = () => z.iso.datetime({ offset: true, message: "Use an ISO instant with a zone, e.g. 2026-11-30T06:00:00+10:00" });

const base = z.object({
  id: z.uuid().optional(),
  fieldId: z.uuid(),
  /** the system that applied the water; the field's own system when absent */
  systemId: z.uuid().nullable().optional(),
  startedAt: instant(),
  endedAt: instant().nullable().optional(),
  method: z.enum(IRRIGATION_METHODS),
  // Depth bounds follow the table's CHECK: 500 mm at once is a flooded bay several times over.
  grossDepthMm: z.number().min(0, "Water is applied, never removed").max(500).optional(),
  netDepthMm: z.number().min(0, "Water is applied, never removed").max(500).optional(),
  volumeM3: z.number().min(0, "Water is applied, never removed").max(10_000_000).optional(),
  // A month of continuous running (31 × 24 h) is the table's limit.
  hours: z.number().min(0).max(744, "At most 744 h (a month) in one event").optional(),
  /** water meter readings in m³ */
  meterStart: z.number().min(0).optional(),
  meterEnd: z.number().min(0).optional(),
  note: z.string().trim().max(2000).nullable().optional(),
});

type Base = z.infer<typeof base>;

function requireInputs(e: Base, ctx: z.RefinementCtx): void {
  const need = (key: keyof Base, message: string) => {
    if (e[key] === undefined || e[key] === null) ctx.addIssue({ code: "custom", path: [key], message });
  };
  if (e.method === "depth") {
    if (e.grossDepthMm === undefined && e.netDepthMm === undefined) need("grossDepthMm", "Give the gross or the net depth in mm");
    if (e.grossDepthMm !== undefined && e.netDepthMm !== undefined) {
      ctx.addIssue({ code: "custom", path: ["netDepthMm"], message: "Give the gross or the net depth, not both" });
    }
  }
  if (e.method === "volume") need("volumeM3", "Give the volume applied in m³");
  if (e.method === "hours") need("hours", "Give the hours the system ran");
  if (e.method === "meter") {
    need("meterStart", "Give the meter reading at the start");
    need("meterEnd", "Give the meter reading at the end");
    if (e.meterStart !== undefined && e.meterEnd !== undefined && e.meterEnd < e.meterStart) {
      ctx.addIssue({ code: "custom", path: ["meterEnd"], message: "A meter only counts up: the end is below the start" });
    }
  }
  if (e.endedAt && Date.parse(e.endedAt) < Date.parse(e.startedAt)) {
    ctx.addIssue({ code: "custom", path: ["endedAt"], message: "The end is before the start" });
  }
}

/** Water applied to a field: by depth, by volume, by run hours × the system's flow, or by meter readings. */
export const irrigationEventSchema = base.superRefine(requireInputs);
export type IrrigationEventInput = z.infer<typeof irrigationEventSchema>;

/** A correction: any input but the field; the quantities are checked again against the method. */
export const irrigationEventPatchSchema = base
  .omit({ id: true, fieldId: true })
  .partial()
  .extend({ reason: z.string().trim().max(500).optional() });
export type IrrigationEventPatch = z.infer<typeof irrigationEventPatchSchema>;

export interface IrrigationAmounts {
  grossDepthMm: number;
  netDepthMm: number | null;
  volumeM3: number | null;
}

/** 1 mm over 1 ha is 10 m³ (so 1 ML = 100 mm over 1 ha: common practice). */
const M3_PER_MM_HA = 10;

/**
 * The gross depth an event put on the field, and the net depth reaching the root zone
 * (net = gross × application efficiency, DESIGN "Irrigation"). Volume spreads over the field's area;
 * run hours take the system's flow rate; meter readings are m³. Throws a 422 naming the input when the
 * system lacks what the method needs, or the result is beyond the 500 mm a single event can apply.
 * @param areaHa the field's area (ha)
 * @param efficiency the system's application efficiency (0-1], null when no system is known
 * @param flowM3H the system's flow rate (m³/h), null when unknown
 */
export function irrigationAmounts(e: IrrigationEventInput, areaHa: number, efficiency: number | null, flowM3H: number | null): IrrigationAmounts {
  let grossDepthMm: number;
  let volumeM3: number | null = null;
  let inputKey: keyof IrrigationEventInput;
  if (e.method === "depth" && e.netDepthMm !== undefined) {
    if (efficiency === null) {
      throw new AppError("invalid", "Net depth needs an irrigation system with an application efficiency.", { netDepthMm: "Choose the system, or give the gross depth" });
    }
    grossDepthMm = e.netDepthMm / efficiency;
    inputKey = "netDepthMm";
  } else if (e.method === "depth") {
    grossDepthMm = e.grossDepthMm ?? 0;
    inputKey = "grossDepthMm";
  } else {
    if (e.method === "volume") {
      volumeM3 = e.volumeM3 ?? 0;
      inputKey = "volumeM3";
    } else if (e.method === "hours") {
      if (flowM3H === null) {
        throw new AppError("invalid", "Run hours need an irrigation system with a flow rate.", { hours: "The system has no flow rate: log by volume or depth" });
      }
      volumeM3 = (e.hours ?? 0) * flowM3H;
      inputKey = "hours";
    } else {
      volumeM3 = (e.meterEnd ?? 0) - (e.meterStart ?? 0);
      inputKey = "meterEnd";
    }
    grossDepthMm = volumeM3 / (areaHa * M3_PER_MM_HA);
  }
  if (grossDepthMm > 500) {
    throw new AppError("invalid", `That is ${grossDepthMm.toFixed(0)} mm over the field, more than one event can apply.`, {
      [inputKey]: "More than 500 mm over the field's area: check the units and the field",
    });
  }
  const netDepthMm = e.method === "depth" && e.netDepthMm !== undefined ? e.netDepthMm : efficiency === null ? null : grossDepthMm * efficiency;
  return { grossDepthMm, netDepthMm, volumeM3 };
}
