import { listFlags } from "@/db/qc";
import { withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { flagQuerySchema } from "@/lib/qc/validation";

// GET /api/v1/farms/:farmId/flags — quality-control flags, newest day first (?status=open&from=&to=)
export const GET = withFarmRole("log", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const url = new URL(req.url);
  const filter = flagQuerySchema.parse({
    status: url.searchParams.get("status") ?? undefined,
    from: url.searchParams.get("from") ?? undefined,
    to: url.searchParams.get("to") ?? undefined,
  });
  const { rows, total } = await listFlags(farmId, filter, page);
  return toPage(rows, page, total);
});
