import { audit } from "@/db/audit";
import { db } from "@/db/knex";
import { withFarmRole } from "@/lib/api/handler";
import { markSeasonDirty, requestRecompute } from "@/lib/accounts/dirty";

// POST /api/v1/farms/:farmId/recompute — rewrite every field's account from the start of its planting (queued; 202)
export const POST = withFarmRole("editSetup", async ({ farmId, user }) => {
  const marked = await db.transaction(async (trx) => {
    const n = await markSeasonDirty(trx, farmId);
    await audit({ farmId, userId: user.id, action: "recompute", entity: "farm", entityId: farmId, after: { fields: n } }, trx);
    return n;
  });
  await requestRecompute(farmId);
  return Response.json({ queued: true, fields: marked }, { status: 202 });
});
