import "server-only";
import webpush from "web-push";
import { db } from "@/db/knex";
import { forgetSubscription, markPushed } from "@/db/push-subscriptions";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { backoffMinutes, MAX_ATTEMPTS } from "./backoff";
import { alertMail, digestMail, pushPayload } from "./messages";
import { vapidKeys } from "./vapid";

/** How long a claimed delivery is held by one worker before another may take it over. */
const LEASE_MS = 5 * 60_000;
/** A push not delivered within this many seconds is dropped by the push service (stale advice helps no one). */
export const PUSH_TTL_S = 12 * 3600;

interface Claimed {
  id: string;
  channel: "push" | "email" | "digest";
  attempts: number;
  target: string;
  notification_id: string;
  farm_id: string;
  farm_name: string;
  user_id: string;
  title: string;
  body: string;
  url: string;
  kind: string;
  endpoint: string | null;
  p256dh: string | null;
  auth: string | null;
  subscription_id: string | null;
}

type Outcome = { status: "sent" } | { status: "gone"; error: string } | { status: "retry" | "failed"; error: string };

/** Temporary failures (429, 5xx, no answer) are retried; the push service saying the device is gone ends it. */
function classify(err: unknown): Outcome {
  const e = err as { statusCode?: number; responseCode?: number; message?: string };
  const message = (e.message ?? String(err)).slice(0, 500);
  if (e.statusCode === 404 || e.statusCode === 410) return { status: "gone", error: `push service answered ${e.statusCode}` };
  // SMTP: 4xx replies are temporary, 5xx permanent (RFC 5321 section 4.2.1).
  if (e.responseCode !== undefined) return { status: e.responseCode < 500 ? "retry" : "failed", error: message };
  // HTTP from the push service: 429 and 5xx are temporary (RFC 8030 section 8.4); no answer at all too.
  const code = e.statusCode;
  if (code === undefined || code === 429 || code >= 500) return { status: "retry", error: message };
  return { status: "failed", error: message };
}

async function sendPush(d: Claimed): Promise<Outcome> {
  if (!d.endpoint || !d.p256dh || !d.auth || !d.subscription_id) return { status: "gone", error: "device unsubscribed" };
  const keys = await vapidKeys();
  const payload = JSON.stringify(pushPayload({ id: d.notification_id, farmId: d.farm_id, title: d.title, body: d.body, url: d.url }));
  try {
    await webpush.sendNotification({ endpoint: d.endpoint, keys: { p256dh: d.p256dh, auth: d.auth } }, payload, {
      vapidDetails: { subject: keys.subject, publicKey: keys.publicKey, privateKey: keys.privateKey },
      TTL: PUSH_TTL_S,
      urgency: d.kind === "field-trigger" || d.kind === "capacity-shortfall" ? "high" : "normal",
    });
    await markPushed(d.subscription_id, new Date());
    return { status: "sent" };
  } catch (err) {
    const outcome = classify(err);
    if (outcome.status === "gone") await forgetSubscription(d.subscription_id);
    return outcome;
  }
}

async function sendEmail(d: Claimed): Promise<Outcome> {
  try {
    await sendMail(alertMail(d.target, d.farm_name, { id: d.notification_id, farmId: d.farm_id, title: d.title, body: d.body, url: d.url }, env().NEXTAUTH_URL));
    return { status: "sent" };
  } catch (err) {
    return classify(err);
  }
}

async function finish(ids: readonly string[], attempts: number, outcome: Outcome, now: Date): Promise<void> {
  const base = { attempts: attempts + 1, last_error: "error" in outcome ? outcome.error : null };
  if (outcome.status === "retry" && attempts + 1 < MAX_ATTEMPTS) {
    await db("notification_deliveries").whereIn("id", ids).update({ ...base, due_at: new Date(now.getTime() + backoffMinutes(attempts + 1) * 60_000) });
    return;
  }
  const status = outcome.status === "retry" ? "failed" : outcome.status;
  await db("notification_deliveries").whereIn("id", ids).update({ ...base, status, sent_at: status === "sent" ? now : null });
}

export interface DeliveryRun {
  sent: number;
  retrying: number;
  failed: number;
  gone: number;
}

/**
 * Sends every delivery that is due: pushes and e-mails one by one, digests one e-mail per person and
 * farm. Claims rows with a lease (skip locked) so several workers can share the queue without sending
 * anything twice.
 */
export async function sendDueDeliveries(now: Date = new Date(), limit = 500): Promise<DeliveryRun> {
  const claimed = (await db.raw(
    `with due as (
       select id from notification_deliveries
        where status = 'pending' and due_at <= ?
        order by due_at limit ? for update skip locked)
     update notification_deliveries d set due_at = ? from due where d.id = due.id
     returning d.id`,
    [now, limit, new Date(now.getTime() + LEASE_MS)],
  )) as { rows: { id: string }[] };
  const run: DeliveryRun = { sent: 0, retrying: 0, failed: 0, gone: 0 };
  if (claimed.rows.length === 0) return run;
  const rows = (await db("notification_deliveries as d")
    .join("notifications as n", "n.id", "d.notification_id")
    .join("farms as f", "f.id", "n.farm_id")
    .leftJoin("push_subscriptions as s", "s.id", "d.subscription_id")
    .whereIn("d.id", claimed.rows.map((r) => r.id))
    .orderBy("n.created_at")
    .select("d.id", "d.channel", "d.attempts", "d.target", "d.notification_id", "d.subscription_id", "n.farm_id", "f.name as farm_name", "n.user_id", "n.title", "n.body", "n.url", "n.kind", "s.endpoint", "s.p256dh", "s.auth")) as Claimed[];
  const count = (o: Outcome, n = 1) => {
    if (o.status === "sent") run.sent += n;
    else if (o.status === "gone") run.gone += n;
    else if (o.status === "retry") run.retrying += n;
    else run.failed += n;
  };
  const digests = new Map<string, Claimed[]>();
  for (const d of rows) {
    if (d.channel === "digest") {
      const key = `${d.user_id}:${d.farm_id}`;
      digests.set(key, [...(digests.get(key) ?? []), d]);
      continue;
    }
    const outcome = d.channel === "push" ? await sendPush(d) : await sendEmail(d);
    await finish([d.id], d.attempts, outcome, now);
    count(outcome);
  }
  for (const group of digests.values()) {
    const first = group[0]!;
    let outcome: Outcome;
    try {
      const alerts = group.map((d) => ({ id: d.notification_id, farmId: d.farm_id, title: d.title, body: d.body, url: d.url }));
      await sendMail(digestMail(first.target, first.farm_name, alerts, env().NEXTAUTH_URL));
      outcome = { status: "sent" };
    } catch (err) {
      outcome = classify(err);
    }
    await finish(group.map((d) => d.id), Math.max(...group.map((d) => d.attempts)), outcome, now);
    count(outcome, group.length);
  }
  return run;
}
