import { encode } from "next-auth/jwt";
import { NextRequest } from "next/server";

export const BASE = "http://localhost:3000";

/** A next-auth session cookie for this user, signed with the app's secret, as the browser would send it. */
export async function sessionCookie(user: { id: string; email: string; name: string }): Promise<string> {
  const token = await encode({
    token: { sub: user.id, email: user.email, name: user.name },
    secret: process.env.NEXTAUTH_SECRET!,
  });
  return `next-auth.session-token=${token}`;
}

type Handler = (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface CallOptions {
  method?: string;
  body?: unknown;
  rawBody?: string;
  as?: { id: string; email: string; name: string } | null;
  params?: Record<string, string>;
  headers?: Record<string, string>;
}

export interface ApiJson {
  error?: { code: string; message: string; fields?: Record<string, string> };
  [key: string]: unknown;
}

/** Calls a route handler directly with a real Request, as Next would, and returns status and JSON. */
export async function call<T = ApiJson>(handler: unknown, path: string, opts: CallOptions = {}): Promise<{ status: number; body: T }> {
  const headers: Record<string, string> = { ...(opts.headers ?? {}) };
  if (opts.as) headers.cookie = await sessionCookie(opts.as);
  let body: string | undefined = opts.rawBody;
  if (opts.body !== undefined) {
    body = JSON.stringify(opts.body);
    headers["content-type"] = "application/json";
  }
  const req = new NextRequest(`${BASE}${path}`, { method: opts.method ?? "GET", headers, body });
  const res = await (handler as Handler)(req, { params: Promise.resolve(opts.params ?? {}) });
  const text = await res.text();
  let parsed: unknown = null;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch {
    parsed = text;
  }
  return { status: res.status, body: parsed as T };
}
