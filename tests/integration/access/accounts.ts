import type { AccessTable } from "./types";

/** Water accounts, outlooks, the farm plan and map status, and the recompute request. */
export const access: AccessTable = {
  "GET /api/v1/farms/[farmId]/fields/[fieldId]/account": "view",
  "GET /api/v1/farms/[farmId]/fields/[fieldId]/outlook": "view",
  "GET /api/v1/farms/[farmId]/plan": "view",
  "GET /api/v1/farms/[farmId]/status": "view",
  "POST /api/v1/farms/[farmId]/recompute": "editSetup",
};
