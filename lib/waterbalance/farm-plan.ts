import { dayNumberToIsoDate, isoDateToDayNumber } from "./dates";
import { requireNonNegative, requirePositive, requireRange, WaterBalanceInputError } from "./errors";
import type { OutlookResult } from "./outlook";

/** A farm's irrigations ordered by urgency within shared pump and system capacity. */

/** A shared limit: a pump or a system, in m³/day, or mm/day over an area. */
export interface CapacityGroup {
  id: string;
  m3PerDay?: number;
  /** mm/day over `areaHa` (1 mm on 1 ha = 10 m³) */
  mmPerDay?: number;
  areaHa?: number;
}

/** One field's pending irrigation. */
export interface PlanField {
  fieldId: string;
  areaHa: number;
  /** first day the field reaches its trigger, or null if not within the horizon */
  dueDate: string | null;
  grossDepthMm: number;
  /** depletion as a fraction of TAW on the due day (breaks ties: drier first) */
  depletionFraction?: number;
  /** capacity groups the irrigation draws on (a pump and a system, say) */
  capacityGroupIds: readonly string[];
}

/** Builds a {@link PlanField} from a field's outlook. */
export function planFieldFromOutlook(
  fieldId: string,
  areaHa: number,
  outlook: OutlookResult,
  capacityGroupIds: readonly string[],
): PlanField {
  const day = outlook.triggerDate ? outlook.days.find((d) => d.date === outlook.triggerDate) : undefined;
  return {
    fieldId,
    areaHa,
    dueDate: outlook.triggerDate,
    grossDepthMm: outlook.grossDepthMm ?? 0,
    depletionFraction: day && day.tawMm > 0 ? day.depletionEndMm / day.tawMm : undefined,
    capacityGroupIds,
  };
}

/** Inputs of {@link planFarm}. */
export interface FarmPlanInput {
  startDate: string;
  days: number;
  fields: readonly PlanField[];
  capacities: readonly CapacityGroup[];
  /** days before its due date a field may start (default 2: start early rather than fall behind) */
  leadDays?: number;
}

/** A planned irrigation. */
export interface PlannedIrrigation {
  fieldId: string;
  rank: number;
  dueDate: string;
  grossDepthMm: number;
  volumeM3: number;
  startDate: string | null;
  endDate: string | null;
  /** days the irrigation finished after its due date (0 when on time) */
  lateDays: number;
  /** volume still unplaced at the end of the horizon, m³ */
  unplacedM3: number;
  allocations: { date: string; volumeM3: number }[];
}

/** A day on which capacity cannot keep up: some irrigation is past due and unfinished. */
export interface ShortfallDay {
  date: string;
  /** overdue volume not yet applied at the end of the day, m³ */
  backlogM3: number;
  fieldIds: string[];
  /** groups with no capacity left that day */
  saturatedGroupIds: string[];
}

/** The farm plan. */
export interface FarmPlanResult {
  irrigations: PlannedIrrigation[];
  /** fields not due within the horizon */
  notDue: string[];
  shortfallDays: ShortfallDay[];
  groupUse: { groupId: string; date: string; usedM3: number; capacityM3: number }[];
}

function groupCapacityM3(g: CapacityGroup): number {
  if (g.m3PerDay !== undefined) return requireNonNegative(`capacities.${g.id}.m3PerDay`, g.m3PerDay);
  if (g.mmPerDay !== undefined && g.areaHa !== undefined) {
    return (
      requireNonNegative(`capacities.${g.id}.mmPerDay`, g.mmPerDay) *
      requirePositive(`capacities.${g.id}.areaHa`, g.areaHa) *
      10
    );
  }
  throw new WaterBalanceInputError(`capacities.${g.id}`, "give m3PerDay, or mmPerDay with areaHa");
}

/**
 * Orders the farm's irrigations by urgency (due date, then drier first) and places them day by day
 * within each shared capacity (earliest due first, each irrigation drawing on all its groups at once,
 * starting up to `leadDays` before it is due). Reports the days on which capacity cannot keep up.
 * Common practice, no source.
 */
export function planFarm(input: FarmPlanInput): FarmPlanResult {
  const startDay = isoDateToDayNumber(input.startDate, "startDate");
  const n = Math.floor(requireRange("days", input.days, 1, 366));
  const lead = Math.floor(requireRange("leadDays", input.leadDays ?? 2, 0, 60));
  const caps = new Map<string, number>();
  for (const g of input.capacities) caps.set(g.id, groupCapacityM3(g));
  const due = input.fields.filter((f) => f.dueDate !== null);
  const notDue = input.fields.filter((f) => f.dueDate === null).map((f) => f.fieldId);
  const jobs = due
    .map((f) => {
      for (const id of f.capacityGroupIds)
        if (!caps.has(id))
          throw new WaterBalanceInputError(
            "capacityGroupIds",
            `unknown group "${id}" for field ${f.fieldId}`,
          );
      const dueDay = isoDateToDayNumber(f.dueDate as string, "dueDate");
      const volume =
        requireNonNegative("grossDepthMm", f.grossDepthMm) * requirePositive("areaHa", f.areaHa) * 10;
      return {
        f,
        dueDay,
        volume,
        remaining: volume,
        start: -1,
        end: -1,
        allocations: [] as { date: string; volumeM3: number }[],
      };
    })
    .sort(
      (a, b) =>
        a.dueDay - b.dueDay ||
        (b.f.depletionFraction ?? 0) - (a.f.depletionFraction ?? 0) ||
        (a.f.fieldId < b.f.fieldId ? -1 : 1),
    );
  const shortfallDays: ShortfallDay[] = [];
  const groupUse: FarmPlanResult["groupUse"] = [];
  for (let t = 0; t < n; t++) {
    const day = startDay + t;
    const left = new Map(caps);
    for (const j of jobs) {
      if (j.remaining <= 1e-9 || day < j.dueDay - lead) continue;
      let alloc = j.remaining;
      for (const id of j.f.capacityGroupIds) alloc = Math.min(alloc, left.get(id)!);
      if (alloc <= 1e-9) continue;
      for (const id of j.f.capacityGroupIds) left.set(id, left.get(id)! - alloc);
      j.remaining -= alloc;
      if (j.start < 0) j.start = day;
      j.end = day;
      j.allocations.push({ date: dayNumberToIsoDate(day), volumeM3: alloc });
    }
    for (const [id, cap] of caps)
      groupUse.push({
        groupId: id,
        date: dayNumberToIsoDate(day),
        usedM3: cap - left.get(id)!,
        capacityM3: cap,
      });
    const late = jobs.filter((j) => j.remaining > 1e-6 && j.dueDay <= day);
    if (late.length) {
      const saturated = new Set<string>();
      for (const j of late)
        for (const id of j.f.capacityGroupIds) if (left.get(id)! <= 1e-6) saturated.add(id);
      shortfallDays.push({
        date: dayNumberToIsoDate(day),
        backlogM3: late.reduce((s, j) => s + j.remaining, 0),
        fieldIds: late.map((j) => j.f.fieldId),
        saturatedGroupIds: [...saturated].sort(),
      });
    }
  }
  const irrigations: PlannedIrrigation[] = jobs.map((j, k) => ({
    fieldId: j.f.fieldId,
    rank: k + 1,
    dueDate: dayNumberToIsoDate(j.dueDay),
    grossDepthMm: j.f.grossDepthMm,
    volumeM3: j.volume,
    startDate: j.start >= 0 ? dayNumberToIsoDate(j.start) : null,
    endDate: j.end >= 0 ? dayNumberToIsoDate(j.end) : null,
    lateDays:
      j.volume <= 1e-9
        ? 0
        : j.end >= 0 && j.remaining <= 1e-6
          ? Math.max(0, j.end - j.dueDay)
          : Math.max(0, startDay + n - 1 - j.dueDay),
    unplacedM3: j.remaining > 1e-6 ? j.remaining : 0,
    allocations: j.allocations,
  }));
  return { irrigations, notDue, shortfallDays, groupUse };
}
