import { NextResponse } from "next/server";

/** The map tile host allowed by the content security policy, from MAP_TILE_URL when it is absolute. */
function tileOrigin(): string {
  const url = process.env.MAP_TILE_URL ?? "";
  if (!/^https?:\/\//.test(url)) return "";
  const host = new URL(url.replace(/\{s\}/g, "a")).host.replace(/^a\./, "*.");
  return `${new URL(url.replace(/\{s\}/g, "a")).protocol}//${host}`;
}

function contentSecurityPolicy(): string {
  const dev = process.env.NODE_ENV !== "production";
  const tiles = tileOrigin();
  return [
    "default-src 'self'",
    `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' data: blob:${tiles ? ` ${tiles}` : ""}`,
    "font-src 'self'",
    `connect-src 'self'${dev ? " ws:" : ""}`,
    "worker-src 'self'",
    "manifest-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** Security headers on every page and API answer. */
export default function proxy(): NextResponse {
  const res = NextResponse.next();
  res.headers.set("Content-Security-Policy", contentSecurityPolicy());
  res.headers.set("X-Content-Type-Options", "nosniff");
  res.headers.set("X-Frame-Options", "DENY");
  res.headers.set("Referrer-Policy", "strict-origin-when-cross-origin");
  res.headers.set("Permissions-Policy", "camera=(self), geolocation=(self), microphone=()");
  if (process.env.NEXTAUTH_URL?.startsWith("https://")) {
    res.headers.set("Strict-Transport-Security", "max-age=31536000; includeSubDomains");
  }
  return res;
}

export const config = {
  matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"],
};
