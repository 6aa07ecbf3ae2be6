import { withFarmRole } from "@/lib/api/handler";
import { farmStatus } from "@/lib/accounts/status";

// GET /api/v1/farms/:farmId/status — one row per field for the farm map: depletion now, TAW, RAW, trigger, band
export const GET = withFarmRole("view", async ({ farmId }) => ({ data: await farmStatus(farmId) }));
