import "server-only";
import bcrypt from "bcryptjs";
import { audit } from "@/db/audit";
import { consumePasswordReset, createPasswordReset } from "@/db/password-resets";
import { hitRateLimit } from "@/db/rate-limits";
import { findUserByEmail, setPasswordHash } from "@/db/users";
import { AppError } from "@/lib/api/errors";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { passwordResetMail } from "@/lib/mail/templates";
import { hashToken, newToken } from "./tokens";

const RESET_TTL_MINUTES = 60;

/**
 * Sends a reset link when the account exists. The answer is the same either way, so the form does not
 * tell strangers which e-mails have accounts.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const limit = await hitRateLimit(`reset:${email}`, 3600, 5);
  if (!limit.allowed) {
    throw new AppError("rate_limited", "Too many reset requests for this address. Try again in an hour.", undefined, {
      "Retry-After": String(limit.retryAfterS),
    });
  }
  const user = await findUserByEmail(email);
  if (!user) return;
  const { token, hash } = newToken();
  await createPasswordReset(user.id, hash, RESET_TTL_MINUTES);
  await sendMail(passwordResetMail(user.email, `${env().NEXTAUTH_URL}/reset/${token}`));
}

export async function confirmPasswordReset(token: string, password: string): Promise<void> {
  const userId = await consumePasswordReset(hashToken(token));
  if (!userId) throw new AppError("gone", "This reset link has expired or was already used. Ask for a new one.");
  await setPasswordHash(userId, await bcrypt.hash(password, 10));
  await audit({ farmId: null, userId, action: "update", entity: "password", entityId: userId });
}
