import type { AccessTable } from "./types";

/** Alerts: rules, the in-app centre, the sent log and push devices. */
export const access: AccessTable = {
  "GET /api/v1/farms/[farmId]/alerts": "view",
  "PUT /api/v1/farms/[farmId]/alerts": "view",
  "POST /api/v1/farms/[farmId]/alerts/check": "editSetup",
  "GET /api/v1/farms/[farmId]/alerts/deliveries": "manageMembers",
  "GET /api/v1/farms/[farmId]/notifications": "view",
  "PATCH /api/v1/farms/[farmId]/notifications/[notificationId]": "view",
  "POST /api/v1/farms/[farmId]/notifications/read-all": "view",
  "GET /api/v1/push/public-key": "public",
  "GET /api/v1/push/subscriptions": "user",
  "POST /api/v1/push/subscriptions": "user",
  "DELETE /api/v1/push/subscriptions": "user",
};
