import "server-only";
import type { Knex } from "knex";
import { farmRecipients } from "@/db/alerts";
import { db } from "@/db/knex";
import { createOnce, queueDelivery, type Notification } from "@/db/notifications";
import { pushTargetsOf } from "@/db/push-subscriptions";
import type { Condition } from "./conditions";
import { nextDigestTime, nextSendTime } from "./quiet-hours";
import { passesThreshold } from "./rules";

export interface DispatchResult {
  /** alerts newly recorded (a condition already alerted today is not counted again) */
  created: number;
  deliveries: number;
}

/**
 * Turns a farm's conditions into alerts for the people whose rules ask for them: one in-app alert per
 * person, condition, subject and day, and the pushes and e-mails that go with it, each due now, at the
 * end of the person's quiet hours, or at their digest hour.
 */
export async function dispatch(farm: { id: string; timeZone: string }, conditions: readonly Condition[], now: Date = new Date()): Promise<DispatchResult> {
  const result: DispatchResult = { created: 0, deliveries: 0 };
  if (conditions.length === 0) return result;
  const recipients = await farmRecipients(farm.id);
  for (const person of recipients) {
    const wanted = conditions.filter((c) => {
      const rule = person.prefs.rules.find((r) => r.kind === c.kind);
      return rule?.enabled === true && passesThreshold(rule, c.measure);
    });
    if (wanted.length === 0) continue;
    const devices = await pushTargetsOf(person.userId);
    const s = person.prefs.settings;
    const quiet = s.quietStart && s.quietEnd ? { start: s.quietStart, end: s.quietEnd } : null;
    const sendAt = nextSendTime(now, farm.timeZone, quiet);
    await db.transaction(async (trx: Knex.Transaction) => {
      for (const c of wanted) {
        const rule = person.prefs.rules.find((r) => r.kind === c.kind)!;
        const n: Notification | null = await createOnce(trx, {
          farmId: farm.id,
          userId: person.userId,
          kind: c.kind,
          subjectKey: c.subjectKey,
          fieldId: c.fieldId,
          localDate: c.localDate,
          title: c.title,
          body: c.body,
          url: c.url,
        });
        if (!n) continue;
        result.created++;
        if (s.digestOnly) {
          // Digest-only: nothing goes out now; the morning e-mail lists it with the rest.
          await queueDelivery(trx, { notificationId: n.id, channel: "digest", target: person.email, dueAt: nextDigestTime(now, farm.timeZone, s.digestHour) });
          result.deliveries++;
          continue;
        }
        if (rule.push) {
          for (const d of devices) {
            await queueDelivery(trx, { notificationId: n.id, channel: "push", subscriptionId: d.id, target: new URL(d.endpoint).host, dueAt: sendAt });
            result.deliveries++;
          }
        }
        if (rule.email) {
          await queueDelivery(trx, { notificationId: n.id, channel: "email", target: person.email, dueAt: sendAt });
          result.deliveries++;
        }
      }
    });
  }
  return result;
}
