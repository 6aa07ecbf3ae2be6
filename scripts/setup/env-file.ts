import { randomBytes } from "node:crypto";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import webpush from "web-push";
import { say } from "./log";

const FILE = ".env.local";

function parse(text: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const line of text.split("\n")) {
    const m = /^\s*([A-Z0-9_]+)\s*=\s*(.*?)\s*$/.exec(line);
    if (m?.[1]) out[m[1]] = (m[2] ?? "").replace(/^"(.*)"$/, "$1");
  }
  return out;
}

/**
 * Generated secrets live in .env.local, written once and then only added to: the auth secret, the
 * VAPID key pair for web push and the private database's password. Values the user set are kept.
 */
export function ensureSecrets(): Record<string, string> {
  const current = existsSync(FILE) ? parse(readFileSync(FILE, "utf8")) : {};
  const added: Record<string, string> = {};
  if (!current.NEXTAUTH_SECRET) added.NEXTAUTH_SECRET = randomBytes(32).toString("base64url");
  if (!current.ROOTBANK_DB_PASSWORD) added.ROOTBANK_DB_PASSWORD = randomBytes(18).toString("base64url");
  if (!current.VAPID_PUBLIC_KEY || !current.VAPID_PRIVATE_KEY) {
    const keys = webpush.generateVAPIDKeys();
    added.VAPID_PUBLIC_KEY = keys.publicKey;
    added.VAPID_PRIVATE_KEY = keys.privateKey;
  }
  if (Object.keys(added).length > 0) {
    const header = existsSync(FILE) ? "" : "# Written by `npm start` on first run. Keep it out of version control.\n";
    const body = Object.entries(added)
      .map(([k, v]) => `${k}=${v}`)
      .join("\n");
    writeFileSync(FILE, `${existsSync(FILE) ? readFileSync(FILE, "utf8").replace(/\n?$/, "\n") : header}${body}\n`, {
      mode: 0o600,
    });
    say(`wrote ${Object.keys(added).join(", ")} to ${FILE}`);
  }
  return { ...current, ...added };
}
