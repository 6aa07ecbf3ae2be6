import { z } from "zod";
import { decideFlag } from "@/db/qc";
import { markFieldsDirty, requestRecompute } from "@/lib/accounts/dirty";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { flagDecisionSchema } from "@/lib/qc/validation";

// PATCH /api/v1/farms/:farmId/flags/:flagId — accept a flagged value, or override it with a reason
export const PATCH = withFarmRole<{ farmId: string; flagId: string }>(
  "editAgronomy",
  async ({ req, params, farmId, user }) => {
    const decision = await readJson(req, flagDecisionSchema);
    const id = z.uuid().safeParse(params.flagId);
    // Whether the value counts changes the accounts from its day on.
    const flag = id.success
      ? await decideFlag(
          farmId,
          id.data,
          { status: decision.status, reason: decision.reason ?? null },
          user.id,
          (trx, f) => markFieldsDirty(trx, { farmId }, f.date),
        )
      : undefined;
    if (!flag) throw new AppError("not_found", "No such flag on this farm.");
    await requestRecompute(farmId);
    return flag;
  },
);
