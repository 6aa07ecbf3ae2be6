/**
 * From a change of rain to what a phone and an inbox receive: rain logged on a gauge, the account
 * recomputed, the alert rules evaluated, and the push decrypted at the local push service (RFC 8030/8291)
 * and the e-mail read from the local SMTP inbox. Dedup, quiet hours, digest, expired devices and retries too.
 * Run with NODE_EXTRA_CA_CERTS=.data/local-tls/cert.pem so web-push trusts the local push service.
 */
import path from "node:path";
import { tmpdir } from "node:os";
import type { Server } from "node:http";
import { TZDate } from "@date-fns/tz";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

const ports = vi.hoisted(() => {
  // Chosen before any app module reads the environment (lib/env.ts reads it once).
  const base = 30000 + Math.floor(Math.random() * 10000) * 3;
  process.env.SMTP_PORT = String(base);
  process.env.LOCAL_INBOX_URL = `http://127.0.0.1:${base + 1}`;
  return { smtp: base, http: base + 1, push: base + 2 };
});

import { db } from "@/db/knex";
import { markFieldsDirty } from "@/lib/accounts/dirty";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { sendDueDeliveries } from "@/lib/alerts/deliver";
import { runAlerts } from "@/lib/jobs/alerts";
import type { PushPayload } from "@/lib/alerts/messages";
import { ALERT_KINDS } from "@/lib/alerts/rules";
import { GET as listNotifications } from "@/app/api/v1/farms/[farmId]/notifications/route";
import { PATCH as patchNotification } from "@/app/api/v1/farms/[farmId]/notifications/[notificationId]/route";
import { PUT as putAlerts } from "@/app/api/v1/farms/[farmId]/alerts/route";
import { GET as deliveriesLog } from "@/app/api/v1/farms/[farmId]/alerts/deliveries/route";
import { POST as subscribe, DELETE as unsubscribe } from "@/app/api/v1/push/subscriptions/route";
import { startInbox } from "../../scripts/fakes/inbox";
import { startPushService, type ReceivedPush } from "../../scripts/fakes/push";
import { ensureLocalCert, localTls } from "../../scripts/fakes/tls";
import { call } from "../helpers/api";
import { mailsTo, waitForMail } from "../helpers/inbox";
import { createAccountFarm, TZ, type AccountFarm } from "./accounts-fixture";

const PUSH = `https://127.0.0.1:${ports.push}`;
let farm: AccountFarm;
let pushServer: Server;
let inbox: ReturnType<typeof startInbox>;

interface FakeDevice {
  id: string;
  subscription: { endpoint: string; keys: { p256dh: string; auth: string } };
}

async function newDevice(): Promise<FakeDevice> {
  return (await (await fetch(`${PUSH}/devices`, { method: "POST" })).json()) as FakeDevice;
}

async function received(device: FakeDevice): Promise<PushPayload[]> {
  const messages = (await (await fetch(`${PUSH}/devices/${device.id}/messages`)).json()) as ReceivedPush[];
  return messages.map((m) => JSON.parse(m.payload) as PushPayload);
}

/** Only the rain rule, push and e-mail, 10 mm: the other conditions of the fixture farm stay quiet. */
function rainOnly(threshold = 10) {
  return ALERT_KINDS.map((kind) => ({ kind, enabled: kind === "rain-skip", push: kind === "rain-skip", email: kind === "rain-skip", threshold: kind === "rain-skip" ? threshold : kind === "outlook-trigger" ? 2 : kind === "sensor-silent" ? 36 : null }));
}

/** "HH:MM" local on the farm, `hours` from now. */
function localHhmm(now: Date, hours: number): string {
  const t = new TZDate(now.getTime() + hours * 3_600_000, TZ);
  return `${String(t.getHours()).padStart(2, "0")}:${String(t.getMinutes()).padStart(2, "0")}`;
}

let phone: FakeDevice;
let oldPhone: FakeDevice;
const now = new Date();

beforeAll(async () => {
  await ensureLocalCert();
  pushServer = startPushService(ports.push, localTls());
  inbox = startInbox({ smtpPort: ports.smtp, httpPort: ports.http, dir: path.join(tmpdir(), `rootbank-alerts-inbox-${ports.smtp}`) });
  await new Promise((r) => setTimeout(r, 200));
  farm = await createAccountFarm();
  await recomputeFarm(farm.farmId, { today: farm.today });
  // Start from a clean slate: what the fixture's own history would alert about is not this test's subject.
  for (const role of ["owner", "agronomist", "worker", "viewer"] as const) {
    const off = ALERT_KINDS.map((kind) => ({ kind, enabled: false, push: false, email: false, threshold: kind === "outlook-trigger" ? 2 : kind === "rain-skip" ? 10 : kind === "sensor-silent" ? 36 : null }));
    await call(putAlerts, `/api/v1/farms/${farm.farmId}/alerts`, { method: "PUT", as: farm.team[role], params: { farmId: farm.farmId }, body: { rules: off } });
  }
  const res = await call(putAlerts, `/api/v1/farms/${farm.farmId}/alerts`, { method: "PUT", as: farm.team.manager, params: { farmId: farm.farmId }, body: { rules: rainOnly() } });
  expect(res.status).toBe(200);
  phone = await newDevice();
  oldPhone = await newDevice();
  for (const d of [phone, oldPhone]) {
    const sub = await call(subscribe, "/api/v1/push/subscriptions", { method: "POST", as: farm.team.manager, body: { ...d.subscription, label: "test phone" } });
    expect(sub.status).toBe(201);
  }
  // The old phone's browser dropped its subscription: the push service now answers 410 Gone.
  await fetch(`${PUSH}/devices/${oldPhone.id}`, { method: "DELETE" });
});

afterAll(async () => {
  pushServer?.close();
  inbox.smtp.close(() => undefined);
  inbox.http.close();
  await db.destroy();
});

async function rainYesterday(depthMm: number): Promise<void> {
  await db("rain_readings").where({ gauge_id: farm.ids.g1, rain_date: farm.yesterday }).update({ depth_mm: depthMm });
  await markFieldsDirty(db, { fieldIds: [farm.ids.a] }, farm.yesterday);
  await recomputeFarm(farm.farmId, { today: farm.today });
}

describe("rain to a phone and an inbox", () => {
  it("pushes the alert to the subscribed phone, e-mails it, and forgets the expired device", async () => {
    // Fixture data: 32 mm on field A's own gauge, well above the 10 mm rule.
    await rainYesterday(32);
    const run = await runAlerts(farm.farmId, now);
    expect(run.created).toBeGreaterThanOrEqual(1);
    const pushes = (await received(phone)).filter((p) => p.url === `/farms/${farm.farmId}/fields/${farm.ids.a}`);
    expect(pushes).toHaveLength(1);
    expect(pushes[0]!.title).toMatch(/of rain on A own gauge/);
    expect(pushes[0]!.body).toMatch(/skipped or shortened/);
    const mail = await waitForMail(farm.team.manager.email, /of rain on A own gauge/);
    expect(mail.text).toContain(`/farms/${farm.farmId}/fields/${farm.ids.a}`);
    expect(mail.text).toMatch(/estimates/);
    // 410 from the push service: the subscription is removed and the log says so.
    expect(await db("push_subscriptions").where({ endpoint: oldPhone.subscription.endpoint }).first()).toBeUndefined();
    const log = await call<{ data: { channel: string; status: string; target: string }[] }>(deliveriesLog, `/api/v1/farms/${farm.farmId}/alerts/deliveries`, { as: farm.team.manager, params: { farmId: farm.farmId } });
    expect(log.body.data.map((d) => d.status).sort()).toEqual(expect.arrayContaining(["sent", "gone"]));
  });

  it("sends nothing twice for the same condition, field and day", async () => {
    const before = (await received(phone)).length;
    const mailsBefore = (await mailsTo(farm.team.manager.email)).length;
    const again = await runAlerts(farm.farmId, now);
    expect(again.created).toBe(0);
    // More rain the same day is still the same condition on the same day.
    await rainYesterday(40);
    expect((await runAlerts(farm.farmId, now)).created).toBe(0);
    expect((await received(phone)).length).toBe(before);
    expect((await mailsTo(farm.team.manager.email)).length).toBe(mailsBefore);
  });

  it("shows the alert in the manager's in-app centre and marks it read", async () => {
    const list = await call<{ data: { id: string; url: string; readAt: string | null }[]; unread: number }>(listNotifications, `/api/v1/farms/${farm.farmId}/notifications`, { as: farm.team.manager, params: { farmId: farm.farmId } });
    expect(list.status).toBe(200);
    const alert = list.body.data.find((n) => n.url.endsWith(farm.ids.a))!;
    expect(alert.readAt).toBeNull();
    expect(list.body.unread).toBeGreaterThanOrEqual(1);
    const read = await call(patchNotification, `/api/v1/farms/${farm.farmId}/notifications/${alert.id}`, { method: "PATCH", as: farm.team.manager, params: { farmId: farm.farmId, notificationId: alert.id }, body: { read: true } });
    expect(read.status).toBe(200);
    // Someone else's alert is not theirs to read: 404, like any id of another person's row.
    const other = await call(patchNotification, `/api/v1/farms/${farm.farmId}/notifications/${alert.id}`, { method: "PATCH", as: farm.team.owner, params: { farmId: farm.farmId, notificationId: alert.id }, body: { read: true } });
    expect(other.status).toBe(404);
  });
});

describe("quiet hours, digest and retries", () => {
  it("holds a push in quiet hours and sends it when they end", async () => {
    const agronomist = farm.team.agronomist;
    const nightPhone = await newDevice();
    await call(subscribe, "/api/v1/push/subscriptions", { method: "POST", as: agronomist, body: nightPhone.subscription });
    const quiet = { quietStart: localHhmm(now, -1), quietEnd: localHhmm(now, 2), digestOnly: false, digestHour: 6 };
    const res = await call(putAlerts, `/api/v1/farms/${farm.farmId}/alerts`, { method: "PUT", as: agronomist, params: { farmId: farm.farmId }, body: { rules: rainOnly(), settings: quiet } });
    expect(res.status).toBe(200);
    await runAlerts(farm.farmId, now);
    expect(await received(nightPhone)).toHaveLength(0);
    const held = (await db("notification_deliveries as d").join("notifications as n", "n.id", "d.notification_id").where({ "n.user_id": agronomist.id, "d.channel": "push" }).first("d.status", "d.due_at")) as { status: string; due_at: Date };
    expect(held.status).toBe("pending");
    // Held until the quiet hours end, two hours on (to the minute).
    expect(Math.abs(held.due_at.getTime() - (now.getTime() + 2 * 3_600_000))).toBeLessThan(60_000);
    await sendDueDeliveries(new Date(held.due_at.getTime() + 1000));
    const pushes = await received(nightPhone);
    expect(pushes).toHaveLength(1);
    expect(pushes[0]!.url).toBe(`/farms/${farm.farmId}/fields/${farm.ids.a}`);
  });

  it("puts digest-only alerts into one morning e-mail", async () => {
    const viewer = farm.team.viewer;
    await call(putAlerts, `/api/v1/farms/${farm.farmId}/alerts`, { method: "PUT", as: viewer, params: { farmId: farm.farmId }, body: { rules: rainOnly(5), settings: { quietStart: null, quietEnd: null, digestOnly: true, digestHour: 6 } } });
    await runAlerts(farm.farmId, now);
    expect(await mailsTo(viewer.email)).toHaveLength(0);
    const due = (await db("notification_deliveries as d").join("notifications as n", "n.id", "d.notification_id").where({ "n.user_id": viewer.id }).select("d.channel", "d.due_at")) as { channel: string; due_at: Date }[];
    expect(due.length).toBeGreaterThanOrEqual(1);
    expect(due.every((d) => d.channel === "digest" && new TZDate(d.due_at.getTime(), TZ).getHours() === 6)).toBe(true);
    await sendDueDeliveries(new Date(Math.max(...due.map((d) => d.due_at.getTime())) + 1000));
    const digest = await waitForMail(viewer.email, /daily digest/);
    expect(digest.text).toMatch(/of rain on A own gauge/);
    expect(await mailsTo(viewer.email)).toHaveLength(1);
  });

  it("retries a push service that does not answer, with backoff, then gives up", async () => {
    const worker = farm.team.worker;
    // Nothing listens on port 9 of this host: a temporary failure as far as the sender can tell.
    const dead = { endpoint: "https://127.0.0.1:9/push/unreachable", keys: phone.subscription.keys };
    await call(subscribe, "/api/v1/push/subscriptions", { method: "POST", as: worker, body: dead });
    await call(putAlerts, `/api/v1/farms/${farm.farmId}/alerts`, { method: "PUT", as: worker, params: { farmId: farm.farmId }, body: { rules: rainOnly().map((r) => ({ ...r, email: false })) } });
    await runAlerts(farm.farmId, now);
    const row = () => db("notification_deliveries as d").join("notifications as n", "n.id", "d.notification_id").where({ "n.user_id": worker.id, "d.channel": "push" }).first("d.status", "d.attempts", "d.due_at") as Promise<{ status: string; attempts: number; due_at: Date }>;
    let d = await row();
    expect(d).toMatchObject({ status: "pending", attempts: 1 });
    // Backoff of 1 minute after the first failure (lib/alerts/deliver.ts backoffMinutes).
    expect(Math.round((d.due_at.getTime() - now.getTime()) / 60_000)).toBe(1);
    let t = now;
    for (let k = 0; k < 10 && d.status === "pending"; k++) {
      t = new Date(d.due_at.getTime() + 1000);
      await sendDueDeliveries(t);
      d = await row();
    }
    expect(d).toMatchObject({ status: "failed", attempts: 6 });
  });

  it("lets a person unsubscribe a device, and only their own", async () => {
    const other = await call(unsubscribe, "/api/v1/push/subscriptions", { method: "DELETE", as: farm.team.owner, body: { endpoint: phone.subscription.endpoint } });
    expect(other.status).toBe(404);
    const mine = await call(unsubscribe, "/api/v1/push/subscriptions", { method: "DELETE", as: farm.team.manager, body: { endpoint: phone.subscription.endpoint } });
    expect(mine.status).toBe(204);
    expect(await db("push_subscriptions").where({ endpoint: phone.subscription.endpoint }).first()).toBeUndefined();
  });
});
