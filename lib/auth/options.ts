import "server-only";
import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { findCredentials } from "@/db/users";
import { forgiveRateLimit, hitRateLimit } from "@/db/rate-limits";
import { env } from "@/lib/env";
import { signInSchema } from "@/lib/validation/auth";

/**
 * Failed sign-in attempts allowed per window, per account and per network address. Every attempt is
 * counted before the password is checked (so a flood is refused without bcrypt work); a successful one is
 * then taken back, so a team signing in many times from one office never locks itself out.
 */
export const SIGN_IN_LIMITS = { windowS: 15 * 60, perAccount: 10, perAddress: 50 };

export const TOO_MANY_ATTEMPTS = "Too many sign-in attempts. Wait 15 minutes, or reset your password by e-mail.";

function clientAddress(headers: Record<string, string | string[] | undefined> | undefined): string {
  const forwarded = headers?.["x-forwarded-for"];
  const first = (Array.isArray(forwarded) ? forwarded[0] : forwarded)?.split(",")[0]?.trim();
  const real = headers?.["x-real-ip"];
  return first || (Array.isArray(real) ? real[0] : real) || "local";
}

export const authOptions: NextAuthOptions = {
  secret: env().NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 30 * 24 * 3600 },
  pages: { signIn: "/sign-in", error: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const parsed = signInSchema.safeParse(credentials);
        if (!parsed.success) return null;
        const { email, password } = parsed.data;
        const keys = [`sign-in:account:${email}`, `sign-in:address:${clientAddress(req?.headers)}`] as const;
        const [perAccount, perAddress] = await Promise.all([
          hitRateLimit(keys[0], SIGN_IN_LIMITS.windowS, SIGN_IN_LIMITS.perAccount),
          hitRateLimit(keys[1], SIGN_IN_LIMITS.windowS, SIGN_IN_LIMITS.perAddress),
        ]);
        if (!perAccount.allowed || !perAddress.allowed) throw new Error(TOO_MANY_ATTEMPTS);
        const found = await findCredentials(email);
        // Compare against a dummy hash when there is no account, so timing does not reveal which e-mails exist.
        const hash = found?.passwordHash ?? "$2b$10$CwTycUXWue0Thq9StjUM0uJ8.cPbJnsg1y3dCjGp3s/dw4H6bBnBa";
        const ok = await bcrypt.compare(password, hash);
        if (!ok || !found?.passwordHash) return null;
        await Promise.all(keys.map((key) => forgiveRateLimit(key, SIGN_IN_LIMITS.windowS)));
        return { id: found.user.id, email: found.user.email, name: found.user.name };
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    session({ session, token }) {
      if (token.sub) session.user = { ...session.user, id: token.sub };
      return session;
    },
  },
};
