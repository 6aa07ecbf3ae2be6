import { preferencesOf, savePreferences } from "@/db/alerts";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { ALERT_KIND_INFO } from "@/lib/alerts/rules";
import { AppError } from "@/lib/api/errors";
import { alertPreferencesSchema } from "@/lib/validation/alerts";

// GET /api/v1/farms/:farmId/alerts — my alert rules on this farm (my role's defaults where I changed nothing) and settings
export const GET = withFarmRole("view", async ({ user, farmId, role }) => preferencesOf(user.id, farmId, role));

// PUT /api/v1/farms/:farmId/alerts — change my alert rules, quiet hours and digest mode on this farm
export const PUT = withFarmRole("view", async ({ req, user, farmId, role }) => {
  const input = await readJson(req, alertPreferencesSchema);
  const fields: Record<string, string> = {};
  input.rules.forEach((r, i) => {
    const info = ALERT_KIND_INFO[r.kind];
    if (info.unit === null && r.threshold !== null) fields[`rules.${i}.threshold`] = "This rule has no threshold";
    if (info.unit !== null && (r.threshold === null || r.threshold < info.min || r.threshold > info.max)) {
      fields[`rules.${i}.threshold`] = `Between ${info.min} and ${info.max} ${info.unit}`;
    }
  });
  if (Object.keys(fields).length) throw new AppError("invalid", "Some thresholds are out of range.", fields);
  return savePreferences(user.id, farmId, role, input);
});
