import { pathId, withFarmLogger } from "@/lib/api/logger-handler";
import { revokeApiToken } from "@/lib/auth/api-tokens";

// DELETE /api/v1/farms/:farmId/api-tokens/:tokenId — revoke a token; the logger is refused from then on
export const DELETE = withFarmLogger<{ farmId: string; tokenId: string }>("manageMembers", { tokens: false }, async ({ farmId, params, author }) => {
  await revokeApiToken(farmId, author, pathId(params.tokenId, "token"));
});
