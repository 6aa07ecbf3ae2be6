import { listAccountDays } from "@/db/accounts";
import { db } from "@/db/knex";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";
import { accountQuerySchema, MAX_ACCOUNT_SPAN_DAYS, searchParams } from "@/lib/accounts/queries";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso, daysBetweenIso } from "@/lib/waterbalance";

// GET /api/v1/farms/:farmId/fields/:fieldId/account — the field's stored water account, every term and its provenance
export const GET = withFarmRole<{ farmId: string; fieldId: string }>("view", async ({ req, params, farmId }) => {
  const query = accountQuerySchema.parse(searchParams(req));
  const field = (await db("fields as f")
    .join("farms as fa", "fa.id", "f.farm_id")
    .where({ "f.id": params.fieldId, "f.farm_id": farmId })
    .first("f.id", "f.name", "f.account_dirty_from", "fa.time_zone")) as
    | { id: string; name: string; account_dirty_from: string | null; time_zone: string }
    | undefined;
  if (!field) throw new AppError("not_found", "No such field on this farm.");
  const to = query.to ?? addDaysIso(farmToday(field.time_zone), -1);
  const from = query.from ?? addDaysIso(to, -29);
  if (daysBetweenIso(from, to) >= MAX_ACCOUNT_SPAN_DAYS) {
    throw new AppError("invalid", `Ask for at most ${MAX_ACCOUNT_SPAN_DAYS} days at a time.`, { from: "span too long" });
  }
  const days = await listAccountDays(field.id, from, to);
  return { fieldId: field.id, name: field.name, from, to, dirtyFrom: field.account_dirty_from, data: days };
});
