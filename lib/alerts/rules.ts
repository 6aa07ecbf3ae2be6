/**
 * What Rootbank can alert about, and each role's starting rules. Pure, so the settings screen shows the
 * same defaults the worker applies. Thresholds are starting points (common practice, no source).
 */
import type { Role } from "@/lib/auth/roles";

export const ALERT_KINDS = ["field-trigger", "outlook-trigger", "rain-skip", "gauge-missed", "sensor-silent", "capacity-shortfall"] as const;
export type AlertKind = (typeof ALERT_KINDS)[number];

export interface AlertRule {
  kind: AlertKind;
  enabled: boolean;
  push: boolean;
  email: boolean;
  /** days (outlook-trigger), mm (rain-skip), hours (sensor-silent); null where the rule has none */
  threshold: number | null;
}

export const ALERT_KIND_INFO: Record<AlertKind, { label: string; help: string; unit: "days" | "mm" | "hours" | null; min: number; max: number }> = {
  "field-trigger": { label: "A field reaches its trigger", help: "Depletion is at or past the field's trigger today.", unit: null, min: 0, max: 0 },
  "outlook-trigger": { label: "The outlook reaches the trigger", help: "The outlook puts the field at its trigger within this many days.", unit: "days", min: 1, max: 14 },
  "rain-skip": { label: "Rain may save an irrigation", help: "At least this much rain fell on a field: a set can be skipped or shortened.", unit: "mm", min: 1, max: 200 },
  "gauge-missed": { label: "A manual gauge missed its reading", help: "Yesterday's reading of a manual rain gauge is not in.", unit: null, min: 0, max: 0 },
  "sensor-silent": { label: "A logger or station went silent", help: "A recording gauge or weather station has sent nothing for this many hours.", unit: "hours", min: 1, max: 720 },
  "capacity-shortfall": { label: "The plan is short of capacity", help: "The farm plan cannot irrigate every due field in time with the pumps it has.", unit: null, min: 0, max: 0 },
};

const DEFAULT_THRESHOLD: Record<AlertKind, number | null> = {
  "field-trigger": null,
  "outlook-trigger": 2,
  "rain-skip": 10,
  "gauge-missed": null,
  "sensor-silent": 36,
  "capacity-shortfall": null,
};

type Default = "push" | "in-app" | "off";

/**
 * Who hears what by default: the people who decide on irrigation get pushes about decisions, the
 * adviser reads them in the app, the field worker hears about the gauges they read, the viewer nothing.
 */
const ROLE_DEFAULTS: Record<Role, Record<AlertKind, Default>> = {
  owner: { "field-trigger": "in-app", "outlook-trigger": "in-app", "rain-skip": "in-app", "gauge-missed": "off", "sensor-silent": "in-app", "capacity-shortfall": "push" },
  manager: { "field-trigger": "push", "outlook-trigger": "push", "rain-skip": "push", "gauge-missed": "push", "sensor-silent": "push", "capacity-shortfall": "push" },
  agronomist: { "field-trigger": "in-app", "outlook-trigger": "in-app", "rain-skip": "in-app", "gauge-missed": "off", "sensor-silent": "in-app", "capacity-shortfall": "off" },
  worker: { "field-trigger": "off", "outlook-trigger": "off", "rain-skip": "off", "gauge-missed": "push", "sensor-silent": "off", "capacity-shortfall": "off" },
  viewer: { "field-trigger": "off", "outlook-trigger": "off", "rain-skip": "off", "gauge-missed": "off", "sensor-silent": "off", "capacity-shortfall": "off" },
};

export function defaultRule(role: Role, kind: AlertKind): AlertRule {
  const d = ROLE_DEFAULTS[role][kind];
  // "push" defaults also e-mail, so a person without a subscribed device still hears without opening the app.
  return { kind, enabled: d !== "off", push: d === "push", email: d === "push", threshold: DEFAULT_THRESHOLD[kind] };
}

/** A person's effective rules: stored ones over their role's defaults, in the order of ALERT_KINDS. */
export function effectiveRules(role: Role, stored: readonly AlertRule[]): AlertRule[] {
  const byKind = new Map(stored.map((r) => [r.kind, r]));
  return ALERT_KINDS.map((kind) => byKind.get(kind) ?? defaultRule(role, kind));
}

/** Whether a condition with `measure` passes a rule's threshold (rules without one always pass). */
export function passesThreshold(rule: AlertRule, measure: number | null): boolean {
  if (rule.threshold === null || measure === null) return true;
  // outlook days count down to the trigger; rain and silence count up
  return rule.kind === "outlook-trigger" ? measure <= rule.threshold : measure >= rule.threshold;
}
