import type { AccessTable } from "./types";

/** Sign-in, people, farms and the API's own edges. */
export const access: AccessTable = {
  "GET /api/[...missing]": "public",
  "POST /api/[...missing]": "public",
  "PUT /api/[...missing]": "public",
  "PATCH /api/[...missing]": "public",
  "DELETE /api/[...missing]": "public",
  "GET /api/auth/[...nextauth]": "public",
  "POST /api/auth/[...nextauth]": "public",
  "GET /api/health": "public",
  "GET /api/v1/openapi.json": "public",
  "GET /api/v1/me": "user",
  "PATCH /api/v1/me": "user",
  "GET /api/v1/farms": "user",
  "GET /api/v1/farms/[farmId]": "view",
  "GET /api/v1/farms/[farmId]/members": "manageMembers",
  "PATCH /api/v1/farms/[farmId]/members/[userId]": "manageMembers",
  "DELETE /api/v1/farms/[farmId]/members/[userId]": "manageMembers",
  "GET /api/v1/farms/[farmId]/invitations": "manageMembers",
  "POST /api/v1/farms/[farmId]/invitations": "manageMembers",
  "DELETE /api/v1/farms/[farmId]/invitations/[invitationId]": "manageMembers",
  "POST /api/v1/invitations/accept": "public",
  "POST /api/v1/password-resets": "public",
  "POST /api/v1/password-resets/confirm": "public",
};
