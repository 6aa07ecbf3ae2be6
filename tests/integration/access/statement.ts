import type { AccessTable } from "./types";

/** The season statement: JSON, CSV, PDF and the e-mailed copy. */
export const access: AccessTable = {
  "GET /api/v1/farms/[farmId]/statement": "readStatement",
  "GET /api/v1/farms/[farmId]/statement.csv": "readStatement",
  "GET /api/v1/farms/[farmId]/statement.pdf": "readStatement",
  "POST /api/v1/farms/[farmId]/statement/send": "readStatement",
};
