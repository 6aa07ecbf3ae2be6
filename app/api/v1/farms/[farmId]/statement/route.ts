import { withFarmRole } from "@/lib/api/handler";
import { searchParams } from "@/lib/accounts/queries";
import { statementResponse } from "@/lib/statement/respond";
import { statementQuerySchema } from "@/lib/validation/statement";

// GET /api/v1/farms/:farmId/statement — the season water statement (JSON, or CSV / PDF with ?format=)
export const GET = withFarmRole("readStatement", async ({ req, farmId }) => statementResponse(farmId, statementQuerySchema.parse(searchParams(req))));
