import "server-only";
import type { NextRequest } from "next/server";
import type { User } from "@/db/users";
import { requireApiUser, requireFarmCapability } from "@/lib/auth/session";
import type { Capability, Role } from "@/lib/auth/roles";
import { handleApiError } from "./errors";

type Params = Record<string, string | string[] | undefined>;
interface RouteContext<P> {
  params: Promise<P>;
}

export interface FarmContext<P> {
  req: NextRequest;
  params: P;
  user: User;
  farmId: string;
  role: Role;
}

function respond(result: unknown, status = 200): Response {
  if (result instanceof Response) return result;
  if (result === undefined) return new Response(null, { status: 204 });
  return Response.json(result, { status });
}

/** A route handler open to anyone; it only gets the one error model. */
export function withErrors<P extends Params>(handler: (req: NextRequest, params: P) => Promise<unknown>) {
  return async (req: NextRequest, context: RouteContext<P>): Promise<Response> => {
    try {
      return respond(await handler(req, await context.params));
    } catch (err) {
      return handleApiError(err);
    }
  };
}

/** A route handler for any signed-in person. */
export function withUser<P extends Params>(handler: (ctx: { req: NextRequest; params: P; user: User }) => Promise<unknown>) {
  return async (req: NextRequest, context: RouteContext<P>): Promise<Response> => {
    try {
      const user = await requireApiUser(req);
      return respond(await handler({ req, params: await context.params, user }));
    } catch (err) {
      return handleApiError(err);
    }
  };
}

/** A route handler under /farms/:farmId that needs `capability` on that farm. */
export function withFarmRole<P extends Params & { farmId: string }>(
  capability: Capability,
  handler: (ctx: FarmContext<P>) => Promise<unknown>,
) {
  return async (req: NextRequest, context: RouteContext<P>): Promise<Response> => {
    try {
      const user = await requireApiUser(req);
      const params = await context.params;
      const role = await requireFarmCapability(user.id, params.farmId, capability);
      return respond(await handler({ req, params, user, farmId: params.farmId, role }));
    } catch (err) {
      return handleApiError(err);
    }
  };
}

/** Reads and validates a JSON body with a zod schema; a bad body is a 400 or 422, never a 500. */
export async function readJson<T>(req: Request, schema: { parse: (v: unknown) => T }): Promise<T> {
  const text = await req.text();
  const value: unknown = text.length === 0 ? {} : JSON.parse(text);
  return schema.parse(value);
}

export function created(body: unknown): Response {
  return Response.json(body, { status: 201 });
}
