/**
 * A local Web Push service for development, the demo and tests. It speaks the push protocol (RFC 8030)
 * to Rootbank's sender, checks the VAPID signature (RFC 8292), and decrypts each message (RFC 8291,
 * aes128gcm) with the keys a test registered for its "device", so a test can read exactly what a phone
 * would have received. Deleting a device makes later pushes answer 410 Gone, as an expired subscription does.
 */
import { createECDH, createPublicKey, randomBytes, randomUUID, verify, type ECDH } from "node:crypto";
import type { IncomingMessage } from "node:http";
import { createServer, type Server } from "node:https";
import { decrypt } from "http_ece";

export interface ReceivedPush {
  receivedAt: string;
  ttl: number;
  urgency: string;
  topic: string | null;
  vapidSubject: string;
  payload: string;
}

interface Device {
  id: string;
  ecdh: ECDH;
  /** the 16-byte auth secret, base64url (RFC 8291 section 3.2) */
  authSecret: string;
  messages: ReceivedPush[];
}

function readBody(req: IncomingMessage): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => resolve(Buffer.concat(chunks)));
    req.on("error", reject);
  });
}

/** Checks `Authorization: vapid t=<jwt>, k=<key>` (RFC 8292): ES256 over the JWT, audience, expiry. */
function checkVapid(header: string | undefined, origin: string): { ok: true; subject: string } | { ok: false; reason: string } {
  const match = /^vapid t=([^,\s]+),\s*k=([A-Za-z0-9_-]+)$/.exec(header ?? "");
  if (!match) return { ok: false, reason: "missing or malformed vapid authorization" };
  const [, jwt, key] = match as unknown as [string, string, string];
  const [head, body, signature] = jwt.split(".");
  if (!head || !body || !signature) return { ok: false, reason: "malformed token" };
  const point = Buffer.from(key, "base64url");
  if (point.length !== 65 || point[0] !== 4) return { ok: false, reason: "k is not an uncompressed P-256 point" };
  const publicKey = createPublicKey({
    key: { kty: "EC", crv: "P-256", x: point.subarray(1, 33).toString("base64url"), y: point.subarray(33).toString("base64url") },
    format: "jwk",
  });
  const valid = verify("sha256", Buffer.from(`${head}.${body}`), { key: publicKey, dsaEncoding: "ieee-p1363" }, Buffer.from(signature, "base64url"));
  if (!valid) return { ok: false, reason: "bad signature" };
  const claims = JSON.parse(Buffer.from(body, "base64url").toString("utf8")) as { aud?: string; exp?: number; sub?: string };
  if (claims.aud !== origin) return { ok: false, reason: `audience ${claims.aud} is not ${origin}` };
  const now = Date.now() / 1000;
  if (!claims.exp || claims.exp < now || claims.exp > now + 24 * 3600) return { ok: false, reason: "expiry missing, past or over 24 h" };
  return { ok: true, subject: claims.sub ?? "" };
}

/** Starts the service on https://127.0.0.1:<port> with the local certificate (see tls.ts). */
export function startPushService(port: number, tls: { key: Buffer; cert: Buffer }): Server {
  const devices = new Map<string, Device>();
  const gone = new Set<string>();
  const origin = `https://127.0.0.1:${port}`;

  const server = createServer(tls, (req, res) => {
    const send = (status: number, body?: unknown, headers: Record<string, string> = {}) => {
      res.writeHead(status, { "Content-Type": "application/json", ...headers });
      res.end(body === undefined ? "" : JSON.stringify(body));
    };
    const url = new URL(req.url ?? "/", origin);
    const parts = url.pathname.split("/").filter(Boolean);

    void (async () => {
      // A "device" registers: the push service hands it an endpoint; the test keeps the keys.
      if (req.method === "POST" && url.pathname === "/devices") {
        const ecdh = createECDH("prime256v1");
        ecdh.generateKeys();
        const device: Device = { id: randomUUID(), ecdh, authSecret: randomBytes(16).toString("base64url"), messages: [] };
        devices.set(device.id, device);
        return send(201, {
          id: device.id,
          subscription: {
            endpoint: `${origin}/push/${device.id}`,
            keys: { p256dh: ecdh.getPublicKey().toString("base64url"), auth: device.authSecret },
          },
        });
      }
      if (parts[0] === "devices" && parts[1]) {
        const device = devices.get(parts[1]);
        if (req.method === "DELETE") {
          devices.delete(parts[1]);
          gone.add(parts[1]);
          return send(204);
        }
        if (req.method === "GET" && parts[2] === "messages") return device ? send(200, device.messages) : send(404, { error: "no such device" });
      }
      if (req.method === "GET" && url.pathname === "/messages") {
        return send(200, [...devices.values()].flatMap((d) => d.messages.map((m) => ({ deviceId: d.id, ...m }))));
      }
      // RFC 8030 section 5: a push message to a subscription.
      if (req.method === "POST" && parts[0] === "push" && parts[1]) {
        if (gone.has(parts[1])) return send(410, { error: "subscription expired" });
        const device = devices.get(parts[1]);
        if (!device) return send(404, { error: "no such subscription" });
        const vapid = checkVapid(req.headers.authorization, origin);
        if (!vapid.ok) return send(403, { error: vapid.reason });
        if (req.headers["content-encoding"] !== "aes128gcm") return send(415, { error: "only aes128gcm is accepted" });
        const ttl = Number(req.headers.ttl);
        if (!Number.isFinite(ttl) || ttl < 0) return send(400, { error: "TTL header required" });
        const body = await readBody(req);
        const payload = decrypt(body, {
          version: "aes128gcm",
          privateKey: device.ecdh,
          authSecret: device.authSecret,
        }).toString("utf8");
        device.messages.push({
          receivedAt: new Date().toISOString(),
          ttl,
          urgency: String(req.headers.urgency ?? "normal"),
          topic: req.headers.topic ? String(req.headers.topic) : null,
          vapidSubject: vapid.subject,
          payload,
        });
        return send(201, undefined, { Location: `${origin}/messages/${randomUUID()}` });
      }
      send(404, { error: "not found" });
    })().catch((err: unknown) => send(400, { error: `could not read the message: ${String(err)}` }));
  });
  server.listen(port, "127.0.0.1");
  return server;
}
