import { listApiTokens } from "@/db/api-tokens";
import { created, readJson } from "@/lib/api/handler";
import { withFarmLogger } from "@/lib/api/logger-handler";
import { issueApiToken } from "@/lib/auth/api-tokens";
import { apiTokenSchema } from "@/lib/validation/api-token";

// GET /api/v1/farms/:farmId/api-tokens — the farm's logger tokens (never the tokens themselves)
export const GET = withFarmLogger("manageMembers", { tokens: false }, async ({ farmId }) => ({ data: await listApiTokens(farmId) }));

// POST /api/v1/farms/:farmId/api-tokens — make a logger token; the answer is the only time it is shown
export const POST = withFarmLogger("manageMembers", { tokens: false }, async ({ req, farmId, author }) => {
  const input = await readJson(req, apiTokenSchema);
  return created(await issueApiToken(farmId, author, input));
});
