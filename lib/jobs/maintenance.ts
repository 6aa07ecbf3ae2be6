import "server-only";
import { db } from "@/db/knex";
import { pruneRateLimits } from "@/db/rate-limits";

/** Hourly housekeeping: old rate-limit windows, used or expired reset links and invitations. */
export async function runMaintenance(): Promise<{ rateLimits: number; resets: number; invitations: number }> {
  const rateLimits = await pruneRateLimits();
  const resets = await db("password_resets").where("expires_at", "<", db.raw("now() - interval '7 days'")).delete();
  const invitations = await db("invitations")
    .whereNull("accepted_at")
    .where("expires_at", "<", db.raw("now() - interval '30 days'"))
    .delete();
  return { rateLimits, resets, invitations };
}
