import "server-only";
import {
  loadFarmObservations,
  loadFarmSetup,
  type AccountField,
  type AccountPlanting,
} from "@/db/account-inputs";
import { getCrop, type Crop } from "@/db/crops";
import { getPlanting, type Planting } from "@/db/plantings";
import { buildFarmContext, buildFieldRun, byFieldId } from "@/lib/accounts/inputs";
import { StationEtoCache } from "@/lib/accounts/station-eto";
import { AppError } from "@/lib/api/errors";
import { farmToday } from "@/lib/farm-time";
import type { CurveEdit } from "@/lib/validation/agronomy";
import {
  addDaysIso,
  runFieldAccount,
  WaterBalanceInputError,
  type FieldAccountResult,
} from "@/lib/waterbalance";

/**
 * A planting's season, loaded once and re-run in memory with other crop curves: the what-if preview
 * and the calibration search run the engine on the stored inputs (weather, rain, irrigation, soil
 * checks) through the same input assembly as the recompute, and store nothing.
 */
export interface PlantingSeason {
  planting: Planting;
  crop: Crop;
  field: AccountField;
  /** the planting as the account runs it (crop values under the planting's overrides) */
  saved: AccountPlanting;
  /** account days the season covers: sowing to its end, the next sowing or yesterday; null before sowing */
  span: { from: string; to: string } | null;
  /** the account with `planting`, from sowing; null when the field cannot have an account yet */
  run: (planting: AccountPlanting) => FieldAccountResult | null;
}

/** The saved planting with an edit on top; a null in the edit means "the crop's own value". */
export function applyCurveEdit(saved: AccountPlanting, crop: Crop, edit: CurveEdit): AccountPlanting {
  const pick = <
    K extends
      | "kcIni"
      | "kcMid"
      | "kcEnd"
      | "stageIniDays"
      | "stageDevDays"
      | "stageMidDays"
      | "stageLateDays"
      | "rootMinM"
      | "rootMaxM"
      | "p",
  >(
    k: K,
  ): number => (edit[k] === undefined ? saved[k] : (edit[k] ?? crop[k]));
  return {
    ...saved,
    kcIni: pick("kcIni"),
    kcMid: pick("kcMid"),
    kcEnd: pick("kcEnd"),
    stageIniDays: pick("stageIniDays"),
    stageDevDays: pick("stageDevDays"),
    stageMidDays: pick("stageMidDays"),
    stageLateDays: pick("stageLateDays"),
    rootMinM: pick("rootMinM"),
    rootMaxM: pick("rootMaxM"),
    p: pick("p"),
    mad: edit.mad === undefined ? saved.mad : edit.mad,
    climateAdjust: edit.climateAdjust ?? saved.climateAdjust,
    kcScale: edit.kcScale === undefined ? saved.kcScale : (edit.kcScale ?? 1),
  };
}

/** Loads the planting's season; 404 when the planting is not this farm's. */
export async function loadPlantingSeason(
  farmId: string,
  plantingId: string,
  today?: string,
): Promise<PlantingSeason> {
  const planting = await getPlanting(farmId, plantingId);
  if (!planting) throw new AppError("not_found", "No such planting on this farm.");
  const crop = await getCrop(farmId, planting.cropId);
  const setup = await loadFarmSetup(farmId, { fieldIds: [planting.fieldId] });
  const field = setup?.fields[0];
  const saved = setup?.plantings.find((p) => p.id === plantingId);
  if (!setup || !field || !saved || !crop)
    throw new AppError("conflict", "This planting's field is archived, so it has no account to tune.");
  const yesterday = addDaysIso(today ?? farmToday(setup.farm.timeZone), -1);
  const next = setup.plantings
    .filter((p) => p.fieldId === field.id && p.plantingDate > saved.plantingDate)
    .sort((a, b) => (a.plantingDate < b.plantingDate ? -1 : 1))[0];
  let to = saved.endDate && saved.endDate < yesterday ? saved.endDate : yesterday;
  if (next && next.plantingDate <= to) to = addDaysIso(next.plantingDate, -1);
  const from = saved.plantingDate;
  if (to < from) return { planting, crop, field, saved, span: null, run: () => null };

  const obs = await loadFarmObservations(setup, [field.id], { from, to, weatherFrom: from });
  const ctx = buildFarmContext(setup, obs);
  const etoCache = new StationEtoCache();
  const byField = { irrigations: byFieldId(obs.irrigations), soilChecks: byFieldId(obs.soilChecks) };
  const run = (p: AccountPlanting): FieldAccountResult | null => {
    const fieldRun = buildFieldRun(
      ctx,
      etoCache,
      field,
      p,
      { from, to, initialDepletionMm: p.initialDepletionMm },
      byField,
    );
    if (!fieldRun) return null;
    try {
      return runFieldAccount(fieldRun.input);
    } catch (err) {
      if (err instanceof WaterBalanceInputError)
        throw new AppError("invalid", `The account cannot run with these values: ${err.message}`);
      throw err;
    }
  };
  return { planting, crop, field, saved, span: { from, to }, run };
}
