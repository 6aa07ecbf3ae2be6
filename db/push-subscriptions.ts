import "server-only";
import type { Knex } from "knex";
import { audit } from "./audit";
import { db } from "./knex";

/** A device a person receives Web Push on; its keys stay in this module and the sender. */
export interface PushDevice {
  id: string;
  label: string | null;
  /** the push service's host, enough for a person to tell devices apart */
  service: string;
  createdAt: string;
  lastSentAt: string | null;
}

export interface PushTarget {
  id: string;
  userId: string;
  endpoint: string;
  keys: { p256dh: string; auth: string };
}

interface Row {
  id: string;
  user_id: string;
  endpoint: string;
  p256dh: string;
  auth: string;
  label: string | null;
  created_at: Date;
  last_sent_at: Date | null;
}

function toDevice(r: Row): PushDevice {
  return { id: r.id, label: r.label, service: new URL(r.endpoint).host, createdAt: r.created_at.toISOString(), lastSentAt: r.last_sent_at?.toISOString() ?? null };
}

function toTarget(r: Row): PushTarget {
  return { id: r.id, userId: r.user_id, endpoint: r.endpoint, keys: { p256dh: r.p256dh, auth: r.auth } };
}

export async function devicesOf(userId: string): Promise<PushDevice[]> {
  return ((await db("push_subscriptions").where({ user_id: userId }).orderBy("created_at")) as Row[]).map(toDevice);
}

export async function pushTargetsOf(userId: string): Promise<PushTarget[]> {
  return ((await db("push_subscriptions").where({ user_id: userId })) as Row[]).map(toTarget);
}

/**
 * Saves a device's subscription. The endpoint names the device: subscribing again replaces its keys, and
 * an endpoint that moved to another person (a shared phone) moves with it. Returns whether it is new.
 */
export async function subscribe(userId: string, sub: { endpoint: string; keys: { p256dh: string; auth: string }; label?: string | undefined }): Promise<{ device: PushDevice; created: boolean }> {
  return db.transaction(async (trx: Knex.Transaction) => {
    const existing = (await trx("push_subscriptions").where({ endpoint: sub.endpoint }).first()) as Row | undefined;
    const values = { user_id: userId, endpoint: sub.endpoint, p256dh: sub.keys.p256dh, auth: sub.keys.auth, label: sub.label ?? null };
    const [row] = (existing
      ? await trx("push_subscriptions").where({ id: existing.id }).update(values).returning("*")
      : await trx("push_subscriptions").insert(values).returning("*")) as Row[];
    await audit({ farmId: null, userId, action: existing ? "update" : "create", entity: "push_subscription", entityId: row!.id, after: { label: row!.label, service: new URL(row!.endpoint).host } }, trx);
    return { device: toDevice(row!), created: !existing };
  });
}

/** Removes one of a person's devices by endpoint or id; false when it is not theirs. */
export async function unsubscribe(userId: string, by: { endpoint: string } | { id: string }): Promise<boolean> {
  return db.transaction(async (trx: Knex.Transaction) => {
    const [row] = (await trx("push_subscriptions").where({ user_id: userId, ...by }).delete().returning("*")) as Row[];
    if (!row) return false;
    await audit({ farmId: null, userId, action: "delete", entity: "push_subscription", entityId: row.id, before: { label: row.label, service: new URL(row.endpoint).host } }, trx);
    return true;
  });
}

/** The push service said the subscription is gone (404/410): forget it. */
export async function forgetSubscription(id: string): Promise<void> {
  await db("push_subscriptions").where({ id }).delete();
}

export async function markPushed(id: string, at: Date): Promise<void> {
  await db("push_subscriptions").where({ id }).update({ last_sent_at: at });
}
