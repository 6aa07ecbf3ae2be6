import { z } from "zod";
import { getImport } from "@/db/imports";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";

// GET /api/v1/farms/:farmId/imports/:importId — one import: status, progress 0-1, counts and report
export const GET = withFarmRole<{ farmId: string; importId: string }>("log", async ({ params, farmId }) => {
  const id = z.uuid().safeParse(params.importId);
  const record = id.success ? await getImport(farmId, id.data) : undefined;
  if (!record) throw new AppError("not_found", "No such import on this farm.");
  return record;
});
