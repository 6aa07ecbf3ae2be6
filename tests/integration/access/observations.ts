import type { AccessTable } from "./types";

/**
 * Rain, weather, irrigation, soil checks and logger tokens. POST rain-records and weather-days also take
 * a logger token instead of a session; observations-tokens.test.ts tries those.
 */
export const access: AccessTable = {
  "GET /api/v1/farms/[farmId]/rain-readings": "view",
  "POST /api/v1/farms/[farmId]/rain-readings": "log",
  "GET /api/v1/farms/[farmId]/rain-readings/[readingId]": "view",
  "PATCH /api/v1/farms/[farmId]/rain-readings/[readingId]": "log",
  "DELETE /api/v1/farms/[farmId]/rain-readings/[readingId]": "log",
  "GET /api/v1/farms/[farmId]/rain-readings/[readingId]/photo": "view",
  "GET /api/v1/farms/[farmId]/rain-records": "view",
  "POST /api/v1/farms/[farmId]/rain-records": "log",
  "GET /api/v1/farms/[farmId]/weather-days": "view",
  "POST /api/v1/farms/[farmId]/weather-days": "log",
  "GET /api/v1/farms/[farmId]/irrigation-events": "view",
  "POST /api/v1/farms/[farmId]/irrigation-events": "log",
  "GET /api/v1/farms/[farmId]/irrigation-events/[eventId]": "view",
  "PATCH /api/v1/farms/[farmId]/irrigation-events/[eventId]": "log",
  "DELETE /api/v1/farms/[farmId]/irrigation-events/[eventId]": "log",
  "GET /api/v1/farms/[farmId]/soil-checks": "view",
  "POST /api/v1/farms/[farmId]/soil-checks": "log",
  "GET /api/v1/farms/[farmId]/soil-checks/[checkId]": "view",
  "PATCH /api/v1/farms/[farmId]/soil-checks/[checkId]": "log",
  "DELETE /api/v1/farms/[farmId]/soil-checks/[checkId]": "log",
  "GET /api/v1/farms/[farmId]/api-tokens": "manageMembers",
  "POST /api/v1/farms/[farmId]/api-tokens": "manageMembers",
  "DELETE /api/v1/farms/[farmId]/api-tokens/[tokenId]": "manageMembers",
};
