import type { AccessTable } from "./types";

/** Imports, quality-control flags and the forecast. */
export const access: AccessTable = {
  "GET /api/v1/farms/[farmId]/imports": "log",
  "POST /api/v1/farms/[farmId]/imports": "log",
  "GET /api/v1/farms/[farmId]/imports/[importId]": "log",
  "GET /api/v1/farms/[farmId]/flags": "log",
  "PATCH /api/v1/farms/[farmId]/flags/[flagId]": "editAgronomy",
  "GET /api/v1/farms/[farmId]/forecast": "view",
  "POST /api/v1/farms/[farmId]/forecast/refresh": "log",
};
