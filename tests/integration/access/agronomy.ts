import type { AccessTable } from "./types";

/** Tuning the crop: what-if preview, saving a curve with its reason, audit history, calibration. */
export const access: AccessTable = {
  "POST /api/v1/farms/[farmId]/plantings/[plantingId]/preview": "editAgronomy",
  "POST /api/v1/farms/[farmId]/plantings/[plantingId]/curve": "editAgronomy",
  "GET /api/v1/farms/[farmId]/plantings/[plantingId]/history": "editAgronomy",
  "GET /api/v1/farms/[farmId]/plantings/[plantingId]/calibration": "editAgronomy",
  "POST /api/v1/farms/[farmId]/plantings/[plantingId]/calibration": "editAgronomy",
  "GET /api/v1/farms/[farmId]/crops/[cropId]/history": "editAgronomy",
  "GET /api/v1/farms/[farmId]/soils/[soilId]/history": "editAgronomy",
};
