import "server-only";
import webpush from "web-push";
import { db } from "@/db/knex";
import { env } from "@/lib/env";

export interface VapidKeys {
  publicKey: string;
  privateKey: string;
  subject: string;
}

const globalForVapid = globalThis as unknown as { rootbankVapid?: Promise<VapidKeys> };

/**
 * The server's VAPID key pair (RFC 8292): from the environment when set (npm start writes them), else
 * made once and kept in the database, so every app server and worker signs with the same pair and
 * browsers' subscriptions stay valid across restarts.
 */
export function vapidKeys(): Promise<VapidKeys> {
  globalForVapid.rootbankVapid ??= (async () => {
    const e = env();
    if (e.VAPID_PUBLIC_KEY && e.VAPID_PRIVATE_KEY) return { publicKey: e.VAPID_PUBLIC_KEY, privateKey: e.VAPID_PRIVATE_KEY, subject: e.VAPID_SUBJECT };
    const made = webpush.generateVAPIDKeys();
    // First writer wins; everyone reads back the stored pair.
    await db("vapid_keys").insert({ id: 1, public_key: made.publicKey, private_key: made.privateKey }).onConflict("id").ignore();
    const row = (await db("vapid_keys").where({ id: 1 }).first()) as { public_key: string; private_key: string };
    return { publicKey: row.public_key, privateKey: row.private_key, subject: e.VAPID_SUBJECT };
  })();
  return globalForVapid.rootbankVapid;
}
