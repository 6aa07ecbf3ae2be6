import { AppError, handleApiError } from "@/lib/api/errors";

function notFound(req: Request): Response {
  return handleApiError(new AppError("not_found", `No API at ${new URL(req.url).pathname}.`));
}

// ANY /api/* — unknown API paths answer JSON 404
export const GET = notFound;
export const POST = notFound;
export const PUT = notFound;
export const PATCH = notFound;
export const DELETE = notFound;
