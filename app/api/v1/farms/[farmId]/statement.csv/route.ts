import { withFarmRole } from "@/lib/api/handler";
import { searchParams } from "@/lib/accounts/queries";
import { statementResponse } from "@/lib/statement/respond";
import { statementQuerySchema } from "@/lib/validation/statement";

// GET /api/v1/farms/:farmId/statement.csv — the season water statement as a CSV download
export const GET = withFarmRole("readStatement", async ({ req, farmId }) =>
  statementResponse(farmId, statementQuerySchema.parse({ ...searchParams(req), format: "csv" })),
);
