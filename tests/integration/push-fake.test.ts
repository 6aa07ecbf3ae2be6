/**
 * The local push service against the web-push library: the real protocol end to end (RFC 8030 delivery,
 * RFC 8292 VAPID, RFC 8291 aes128gcm encryption), decrypted with the device keys the fake keeps.
 */
import type { Server } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import webpush from "web-push";
import { startPushService, type ReceivedPush } from "../../scripts/fakes/push";
import { localTls } from "../../scripts/fakes/tls";

const PORT = 2795;
// npm test made the local certificate and gave it to this process as NODE_EXTRA_CA_CERTS.
const BASE = `https://127.0.0.1:${PORT}`;
let server: Server;
const vapid = webpush.generateVAPIDKeys();
const options = { vapidDetails: { subject: "mailto:alerts@rootbank.local", publicKey: vapid.publicKey, privateKey: vapid.privateKey }, TTL: 3600 };

async function newDevice(): Promise<{ id: string; subscription: webpush.PushSubscription }> {
  return (await (await fetch(`${BASE}/devices`, { method: "POST" })).json()) as { id: string; subscription: webpush.PushSubscription };
}

beforeAll(() => {
  server = startPushService(PORT, localTls());
});

afterAll(() => {
  server.close();
});

describe("local push service", () => {
  it("receives a VAPID-signed aes128gcm message and decrypts it to the payload that was sent", async () => {
    const device = await newDevice();
    const payload = JSON.stringify({ title: "Top Pivot is due", url: "/farms/x/fields/y" });
    const sent = await webpush.sendNotification(device.subscription, payload, { ...options, urgency: "high" });
    expect(sent.statusCode).toBe(201);
    const messages = (await (await fetch(`${BASE}/devices/${device.id}/messages`)).json()) as ReceivedPush[];
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ payload, ttl: 3600, urgency: "high", vapidSubject: "mailto:alerts@rootbank.local" });
  });

  it("answers 410 Gone once the device unsubscribed, and 404 for an unknown subscription", async () => {
    const device = await newDevice();
    await fetch(`${BASE}/devices/${device.id}`, { method: "DELETE" });
    await expect(webpush.sendNotification(device.subscription, "x", options)).rejects.toMatchObject({ statusCode: 410 });
    const unknown = { ...device.subscription, endpoint: `${BASE}/push/00000000-0000-4000-8000-000000000000` };
    await expect(webpush.sendNotification(unknown, "x", options)).rejects.toMatchObject({ statusCode: 404 });
  });

  it("refuses a message signed with another key pair than the one it names", async () => {
    const device = await newDevice();
    const other = webpush.generateVAPIDKeys();
    const headers = webpush.getVapidHeaders(`${BASE}`, "mailto:x@rootbank.local", vapid.publicKey, other.privateKey, "aes128gcm");
    const res = await fetch(device.subscription.endpoint, {
      method: "POST",
      headers: { ...headers, TTL: "60", "Content-Encoding": "aes128gcm" },
      body: "not encrypted",
    });
    expect(res.status).toBe(403);
  });
});
