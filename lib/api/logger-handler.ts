import "server-only";
import type { NextRequest } from "next/server";
import type { ApiToken } from "@/db/api-tokens";
import { touchApiToken } from "@/db/api-tokens";
import { hitRateLimit } from "@/db/rate-limits";
import { authenticateApiToken, bearerOf, type Author } from "@/lib/auth/api-tokens";
import { isUuid, requireApiUser, requireFarmCapability } from "@/lib/auth/session";
import { requestRecompute } from "@/lib/accounts/dirty";
import type { Capability } from "@/lib/auth/roles";
import { AppError, handleApiError } from "./errors";

type Params = Record<string, string | string[] | undefined> & { farmId: string };
interface RouteContext<P> {
  params: Promise<P>;
}

export interface LoggerContext<P> {
  req: NextRequest;
  params: P;
  farmId: string;
  author: Author;
  /** the logger's token when the request came with one; the handler checks its scope */
  token: ApiToken | null;
}

/** Requests per token per minute: a logger posting every 10 s uses 6, a backlog upload in batches a few more. */
export const TOKEN_RATE_LIMIT = { windowS: 60, limit: 600 };

function respond(result: unknown): Response {
  if (result instanceof Response) return result;
  if (result === undefined) return new Response(null, { status: 204 });
  return Response.json(result);
}

async function tokenAuthor(bearer: string, farmId: string): Promise<{ author: Author; token: ApiToken }> {
  const token = await authenticateApiToken(bearer);
  const hit = await hitRateLimit(`api-token:${token.id}`, TOKEN_RATE_LIMIT.windowS, TOKEN_RATE_LIMIT.limit);
  if (!hit.allowed) {
    throw new AppError("rate_limited", `Too many requests with this token. Wait ${hit.retryAfterS} s.`, undefined, {
      "Retry-After": String(hit.retryAfterS),
    });
  }
  await touchApiToken(token.id);
  if (token.farmId !== farmId) throw new AppError("forbidden", "This API token belongs to another farm.");
  return { author: { userId: null, actor: `token:${token.name}` }, token };
}

/**
 * Like withFarmRole, for the observation routes. With `tokens: true` a logger may call the route with
 * `Authorization: Bearer rbk_…` instead of a session (rate-limited per token, its farm only); the
 * handler then checks the token's gauge or station scope. Elsewhere a token is refused with a 403.
 */
export function withFarmLogger<P extends Params>(
  capability: Capability,
  options: { tokens: boolean },
  handler: (ctx: LoggerContext<P>) => Promise<unknown>,
) {
  return async (req: NextRequest, context: RouteContext<P>): Promise<Response> => {
    try {
      const params = await context.params;
      const bearer = bearerOf(req);
      if (bearer !== undefined) {
        if (!options.tokens) throw new AppError("forbidden", "API tokens may only post rain records and weather days.");
        const { author, token } = await tokenAuthor(bearer, params.farmId);
        return respond(await handler({ req, params, farmId: params.farmId, author, token }));
      }
      const user = await requireApiUser(req);
      await requireFarmCapability(user.id, params.farmId, capability);
      return respond(await handler({ req, params, farmId: params.farmId, author: { userId: user.id, actor: "user" }, token: null }));
    } catch (err) {
      return handleApiError(err);
    }
  };
}

/** Query parameters checked with a zod schema; a bad one is a 422 naming it. */
export function readQuery<T>(req: Request, schema: { parse: (v: unknown) => T }): T {
  return schema.parse(Object.fromEntries(new URL(req.url).searchParams));
}

/** A path id that is not a uuid names nothing: 404, like an id of another farm's row. */
export function pathId(value: string | string[] | undefined, what: string): string {
  if (typeof value !== "string" || !isUuid(value)) throw new AppError("not_found", `No such ${what}.`);
  return value;
}

/**
 * Asks for the farm's accounts to be brought up to date, after a write has committed. A queue that is
 * down does not fail the write: the fields stay marked dirty and the nightly run picks them up.
 */
export async function recomputeSoon(farmId: string): Promise<void> {
  try {
    await requestRecompute(farmId);
  } catch (err) {
    console.error("recompute request failed; the nightly run will catch up:", err);
  }
}
