import { markRead } from "@/db/notifications";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { isUuid } from "@/lib/auth/session";
import { notificationPatchSchema } from "@/lib/validation/alerts";

// PATCH /api/v1/farms/:farmId/notifications/:notificationId — mark one of my alerts read or unread
export const PATCH = withFarmRole<{ farmId: string; notificationId: string }>("view", async ({ req, params, user, farmId }) => {
  const input = await readJson(req, notificationPatchSchema);
  const n = isUuid(params.notificationId) ? await markRead(user.id, farmId, params.notificationId, input.read) : null;
  if (!n) throw new AppError("not_found", "No such alert.");
  return n;
});
