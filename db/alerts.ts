import "server-only";
import type { Knex } from "knex";
import { audit } from "./audit";
import { db } from "./knex";
import { ALERT_KINDS, effectiveRules, type AlertKind, type AlertRule } from "@/lib/alerts/rules";
import type { Role } from "@/lib/auth/roles";

/** A person's alert settings on one farm (quiet hours in the farm's zone, digest-only mode). */
export interface AlertSettings {
  quietStart: string | null;
  quietEnd: string | null;
  digestOnly: boolean;
  digestHour: number;
}

export const DEFAULT_SETTINGS: AlertSettings = { quietStart: null, quietEnd: null, digestOnly: false, digestHour: 6 };

interface RuleRow {
  user_id: string;
  farm_id: string;
  kind: AlertKind;
  enabled: boolean;
  push: boolean;
  email: boolean;
  threshold: number | null;
}

interface SettingsRow {
  user_id: string;
  quiet_start: string | null;
  quiet_end: string | null;
  digest_only: boolean;
  digest_hour: number;
}

function toRule(r: RuleRow): AlertRule {
  return { kind: r.kind, enabled: r.enabled, push: r.push, email: r.email, threshold: r.threshold };
}

function toSettings(r: SettingsRow | undefined): AlertSettings {
  if (!r) return { ...DEFAULT_SETTINGS };
  return { quietStart: r.quiet_start, quietEnd: r.quiet_end, digestOnly: r.digest_only, digestHour: r.digest_hour };
}

export interface AlertPreferences {
  rules: AlertRule[];
  settings: AlertSettings;
}

/** One person's effective rules (stored over role defaults) and settings on a farm. */
export async function preferencesOf(userId: string, farmId: string, role: Role): Promise<AlertPreferences> {
  const rows = (await db("alert_rules").where({ user_id: userId, farm_id: farmId })) as RuleRow[];
  const settings = (await db("alert_settings").where({ user_id: userId, farm_id: farmId }).first()) as SettingsRow | undefined;
  return { rules: effectiveRules(role, rows.map(toRule)), settings: toSettings(settings) };
}

/** Every member of a farm with their e-mail, role and effective preferences, for the evaluator. */
export async function farmRecipients(farmId: string): Promise<{ userId: string; email: string; name: string; role: Role; prefs: AlertPreferences }[]> {
  const members = (await db("memberships as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.farm_id", farmId)
    .select("u.id", "u.email", "u.name", "m.role")) as { id: string; email: string; name: string; role: Role }[];
  const rules = (await db("alert_rules").where({ farm_id: farmId })) as RuleRow[];
  const settings = (await db("alert_settings").where({ farm_id: farmId })) as SettingsRow[];
  return members.map((m) => ({
    userId: m.id,
    email: m.email,
    name: m.name,
    role: m.role,
    prefs: {
      rules: effectiveRules(m.role, rules.filter((r) => r.user_id === m.id).map(toRule)),
      settings: toSettings(settings.find((s) => s.user_id === m.id)),
    },
  }));
}

/** Stores the rules a person changed and their settings, audited in the same transaction. */
export async function savePreferences(
  userId: string,
  farmId: string,
  role: Role,
  input: { rules: readonly AlertRule[]; settings?: AlertSettings },
): Promise<AlertPreferences> {
  return db.transaction(async (trx: Knex.Transaction) => {
    const before = await preferencesOf(userId, farmId, role);
    for (const rule of input.rules) {
      if (!ALERT_KINDS.includes(rule.kind)) continue;
      await trx("alert_rules")
        .insert({ user_id: userId, farm_id: farmId, kind: rule.kind, enabled: rule.enabled, push: rule.push, email: rule.email, threshold: rule.threshold })
        .onConflict(["user_id", "farm_id", "kind"])
        .merge(["enabled", "push", "email", "threshold", "updated_at"]);
    }
    if (input.settings) {
      const s = input.settings;
      await trx("alert_settings")
        .insert({ user_id: userId, farm_id: farmId, quiet_start: s.quietStart, quiet_end: s.quietEnd, digest_only: s.digestOnly, digest_hour: s.digestHour })
        .onConflict(["user_id", "farm_id"])
        .merge(["quiet_start", "quiet_end", "digest_only", "digest_hour", "updated_at"]);
    }
    const rows = (await trx("alert_rules").where({ user_id: userId, farm_id: farmId })) as RuleRow[];
    const settings = (await trx("alert_settings").where({ user_id: userId, farm_id: farmId }).first()) as SettingsRow | undefined;
    const after = { rules: effectiveRules(role, rows.map(toRule)), settings: toSettings(settings) };
    await audit({ farmId, userId, action: "update", entity: "alert_preferences", entityId: userId, before, after }, trx);
    return after;
  });
}
