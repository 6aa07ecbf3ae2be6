import { withFarmRole } from "@/lib/api/handler";
import { searchParams } from "@/lib/accounts/queries";
import { statementResponse } from "@/lib/statement/respond";
import { statementQuerySchema } from "@/lib/validation/statement";

// GET /api/v1/farms/:farmId/statement.pdf — the season water statement as an A4 PDF
export const GET = withFarmRole("readStatement", async ({ req, farmId }) =>
  statementResponse(farmId, statementQuerySchema.parse({ ...searchParams(req), format: "pdf" })),
);
