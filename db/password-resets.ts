import "server-only";
import { db } from "./knex";

export async function createPasswordReset(userId: string, tokenHash: string, ttlMinutes: number): Promise<void> {
  await db("password_resets").insert({
    user_id: userId,
    token_hash: tokenHash,
    expires_at: db.raw(`now() + make_interval(mins => ?)`, [ttlMinutes]),
  });
}

/** Marks an open reset used and returns its user; undefined when the link is unknown, used or expired. */
export async function consumePasswordReset(tokenHash: string): Promise<string | undefined> {
  const [row] = await db("password_resets")
    .where({ token_hash: tokenHash })
    .whereNull("used_at")
    .where("expires_at", ">", db.fn.now())
    .update({ used_at: db.fn.now() })
    .returning("user_id");
  return row?.user_id as string | undefined;
}
