import { listImports } from "@/db/imports";
import { AppError } from "@/lib/api/errors";
import { withFarmRole } from "@/lib/api/handler";
import { pageQuery, toPage } from "@/lib/api/pagination";
import { can } from "@/lib/auth/roles";
import { MAX_IMPORT_BYTES, startFileImport } from "@/lib/imports/run";
import { readUpload } from "@/lib/imports/upload";

// GET /api/v1/farms/:farmId/imports — past imports, newest first, with their reports
export const GET = withFarmRole("log", async ({ req, farmId }) => {
  const page = pageQuery(req);
  const { rows, total } = await listImports(farmId, page);
  return toPage(rows, page, total);
});

// POST /api/v1/farms/:farmId/imports — import a weather, rain logger, gauge readings or boundary file
export const POST = withFarmRole("log", async ({ req, farmId, user, role }) => {
  const upload = await readUpload(req, MAX_IMPORT_BYTES);
  if (upload.request.kind === "boundaries" && !can(role, "editSetup")) {
    throw new AppError("forbidden", "Your role on this farm does not allow changing field boundaries.");
  }
  const { record, repeat, background } = await startFileImport({ farmId, userId: user.id, ...upload });
  // 200: the same file was imported before and nothing changed; 202: under way, poll the import.
  const status = repeat ? 200 : background ? 202 : 201;
  return Response.json(
    { ...record, repeat },
    { status, headers: { location: `/api/v1/farms/${farmId}/imports/${record.id}` } },
  );
});
