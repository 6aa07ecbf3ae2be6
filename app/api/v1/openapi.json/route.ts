import { withErrors } from "@/lib/api/handler";
import { env } from "@/lib/env";
import { openApiDocument } from "@/lib/openapi/document";

// GET /api/v1/openapi.json — the OpenAPI 3.1 description of this API
export const GET = withErrors(async () => openApiDocument(env().NEXTAUTH_URL));
