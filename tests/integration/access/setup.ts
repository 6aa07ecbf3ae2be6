import type { AccessTable } from "./types";

/** Farm settings, soils and crops, equipment, fields and plantings. */
export const access: AccessTable = {
  "PATCH /api/v1/farms/[farmId]": "editSetup",
  ...crud("soils", "soilId", "editAgronomy"),
  ...crud("crops", "cropId", "editAgronomy"),
  ...crud("systems", "systemId", "editSetup"),
  ...crud("gauges", "gaugeId", "editSetup"),
  ...crud("stations", "stationId", "editSetup"),
  ...crud("fields", "fieldId", "editSetup"),
  ...crud("plantings", "plantingId", "editAgronomy"),
};

function crud(segment: string, param: string, write: "editSetup" | "editAgronomy"): AccessTable {
  const base = `/api/v1/farms/[farmId]/${segment}`;
  return {
    [`GET ${base}`]: "view",
    [`POST ${base}`]: write,
    [`GET ${base}/[${param}]`]: "view",
    [`PATCH ${base}/[${param}]`]: write,
    [`DELETE ${base}/[${param}]`]: write,
  };
}
