import type { FarmPlanDto } from "@/lib/client/use-plan";

export interface PlanRow {
  fieldId: string;
  field: string;
  system: string;
  flowM3H: number | null;
  dueDate: string;
  startDate: string | null;
  endDate: string | null;
  grossDepthMm: number;
  volumeM3: number;
  /** hours to apply the volume placed in the plan's days at the system's flow, when it has one */
  durationH: number | null;
  lateDays: number;
  unplacedM3: number;
}

/** The plan's irrigations joined with their field and system, in plan order. */
export function planRows(
  plan: FarmPlanDto,
  fields: ReadonlyMap<string, { name: string; systemId: string | null }>,
  systems: ReadonlyMap<string, { name: string; flowM3H: number | null }>,
): PlanRow[] {
  return [...plan.irrigations]
    .sort((a, b) => (a.startDate ?? "9999").localeCompare(b.startDate ?? "9999") || a.rank - b.rank)
    .map((i) => {
      const f = fields.get(i.fieldId);
      const s = f?.systemId ? systems.get(f.systemId) : undefined;
      const flow = s?.flowM3H ?? null;
      return {
        fieldId: i.fieldId,
        field: f?.name ?? "unknown field",
        system: s?.name ?? "",
        flowM3H: flow,
        dueDate: i.dueDate,
        startDate: i.startDate,
        endDate: i.endDate,
        grossDepthMm: i.grossDepthMm,
        volumeM3: i.volumeM3,
        durationH: flow ? (i.volumeM3 - i.unplacedM3) / flow : null,
        lateDays: i.lateDays,
        unplacedM3: i.unplacedM3,
      };
    });
}

function cell(v: string | number | null): string {
  if (v === null) return "";
  const s = typeof v === "number" ? String(Math.round(v * 100) / 100) : v;
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** The plan as CSV (RFC 4180), SI units in the column names so a spreadsheet reads it without guessing. */
export function planCsv(rows: readonly PlanRow[]): string {
  const head = ["field", "system", "flow_m3_h", "due_date", "start_date", "end_date", "gross_depth_mm", "volume_m3", "duration_h", "late_days", "unplaced_m3"];
  const lines = rows.map((r) =>
    [r.field, r.system, r.flowM3H, r.dueDate, r.startDate, r.endDate, r.grossDepthMm, r.volumeM3, r.durationH, r.lateDays, r.unplacedM3].map(cell).join(","),
  );
  return [head.join(","), ...lines].join("\r\n") + "\r\n";
}
