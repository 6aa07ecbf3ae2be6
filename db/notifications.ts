import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";
import type { AlertKind } from "@/lib/alerts/rules";
import type { PageQuery } from "@/lib/api/pagination";

/** One alert as a person's in-app centre shows it. */
export interface Notification {
  id: string;
  farmId: string;
  kind: AlertKind;
  fieldId: string | null;
  localDate: string;
  title: string;
  body: string;
  url: string;
  createdAt: string;
  readAt: string | null;
}

export type DeliveryChannel = "push" | "email" | "digest";
export type DeliveryStatus = "pending" | "sent" | "failed" | "gone";

/** One attempt to reach a person outside the app, as the sent log shows it. */
export interface Delivery {
  id: string;
  notificationId: string;
  userId: string;
  userName: string;
  kind: AlertKind;
  title: string;
  channel: DeliveryChannel;
  target: string;
  status: DeliveryStatus;
  attempts: number;
  dueAt: string;
  sentAt: string | null;
  lastError: string | null;
}

interface NotificationRow {
  id: string;
  farm_id: string;
  user_id: string;
  kind: AlertKind;
  field_id: string | null;
  local_date: string;
  title: string;
  body: string;
  url: string;
  created_at: Date;
  read_at: Date | null;
}

function toNotification(r: NotificationRow): Notification {
  return {
    id: r.id,
    farmId: r.farm_id,
    kind: r.kind,
    fieldId: r.field_id,
    localDate: r.local_date,
    title: r.title,
    body: r.body,
    url: r.url,
    createdAt: r.created_at.toISOString(),
    readAt: r.read_at?.toISOString() ?? null,
  };
}

export interface NewNotification {
  farmId: string;
  userId: string;
  kind: AlertKind;
  subjectKey: string;
  fieldId: string | null;
  localDate: string;
  title: string;
  body: string;
  url: string;
}

/**
 * Records an alert unless the same person already has one for this condition, subject and day; returns
 * it only when it is new, so the caller delivers each condition once.
 */
export async function createOnce(trx: Knex | Knex.Transaction, n: NewNotification): Promise<Notification | null> {
  const [row] = (await trx("notifications")
    .insert({
      farm_id: n.farmId,
      user_id: n.userId,
      kind: n.kind,
      subject_key: n.subjectKey,
      field_id: n.fieldId,
      local_date: n.localDate,
      title: n.title,
      body: n.body,
      url: n.url,
    })
    .onConflict(["user_id", "farm_id", "kind", "subject_key", "local_date"])
    .ignore()
    .returning("*")) as NotificationRow[];
  return row ? toNotification(row) : null;
}

export async function queueDelivery(
  trx: Knex | Knex.Transaction,
  d: { notificationId: string; channel: DeliveryChannel; subscriptionId?: string; target: string; dueAt: Date },
): Promise<void> {
  await trx("notification_deliveries").insert({
    notification_id: d.notificationId,
    channel: d.channel,
    subscription_id: d.subscriptionId ?? null,
    target: d.target,
    due_at: d.dueAt,
  });
}

export async function listNotifications(userId: string, farmId: string, page: PageQuery, unreadOnly: boolean): Promise<{ rows: Notification[]; total: number; unread: number }> {
  const base = () => {
    const q = db("notifications").where({ user_id: userId, farm_id: farmId });
    return unreadOnly ? q.whereNull("read_at") : q;
  };
  const rows = (await base().orderBy([{ column: "created_at", order: "desc" }, { column: "id" }]).limit(page.limit).offset(page.offset)) as NotificationRow[];
  const [{ count }] = (await base().count({ count: "*" })) as [{ count: string }];
  return { rows: rows.map(toNotification), total: Number(count), unread: await unreadCount(userId, farmId) };
}

export async function unreadCount(userId: string, farmId: string): Promise<number> {
  const [{ count }] = (await db("notifications").where({ user_id: userId, farm_id: farmId }).whereNull("read_at").count({ count: "*" })) as [{ count: string }];
  return Number(count);
}

/** Marks one of a person's alerts read or unread; null when it is not theirs on this farm. */
export async function markRead(userId: string, farmId: string, id: string, read: boolean): Promise<Notification | null> {
  const [row] = (await db("notifications")
    .where({ id, user_id: userId, farm_id: farmId })
    .update({ read_at: read ? db.fn.now() : null })
    .returning("*")) as NotificationRow[];
  return row ? toNotification(row) : null;
}

export async function markAllRead(userId: string, farmId: string): Promise<number> {
  return db("notifications").where({ user_id: userId, farm_id: farmId }).whereNull("read_at").update({ read_at: db.fn.now() });
}

interface DeliveryRow {
  id: string;
  notification_id: string;
  user_id: string;
  user_name: string;
  kind: AlertKind;
  title: string;
  channel: DeliveryChannel;
  target: string;
  status: DeliveryStatus;
  attempts: number;
  due_at: Date;
  sent_at: Date | null;
  last_error: string | null;
}

function toDelivery(r: DeliveryRow): Delivery {
  return {
    id: String(r.id),
    notificationId: r.notification_id,
    userId: r.user_id,
    userName: r.user_name,
    kind: r.kind,
    title: r.title,
    channel: r.channel,
    target: r.target,
    status: r.status,
    attempts: r.attempts,
    dueAt: r.due_at.toISOString(),
    sentAt: r.sent_at?.toISOString() ?? null,
    lastError: r.last_error,
  };
}

/** The farm's sent log, newest first: what went to whom, by which channel, and how it ended. */
export async function deliveryLog(farmId: string, page: PageQuery): Promise<{ rows: Delivery[]; total: number }> {
  const base = () => db("notification_deliveries as d").join("notifications as n", "n.id", "d.notification_id").where("n.farm_id", farmId);
  const rows = (await base()
    .join("users as u", "u.id", "n.user_id")
    .select("d.*", "n.user_id", "u.name as user_name", "n.kind", "n.title")
    .orderBy([{ column: "d.created_at", order: "desc" }, { column: "d.id", order: "desc" }])
    .limit(page.limit)
    .offset(page.offset)) as DeliveryRow[];
  const [{ count }] = (await base().count({ count: "*" })) as [{ count: string }];
  return { rows: rows.map(toDelivery), total: Number(count) };
}
