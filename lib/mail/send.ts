import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

const globalForMail = globalThis as unknown as { rootbankMail?: Transporter };

function transport(): Transporter {
  if (!globalForMail.rootbankMail) {
    const e = env();
    globalForMail.rootbankMail = nodemailer.createTransport({
      host: e.SMTP_HOST,
      port: e.SMTP_PORT,
      secure: e.SMTP_PORT === 465,
      // The local inbox speaks plain SMTP; a real relay upgrades with STARTTLS when it offers it.
      ignoreTLS: Boolean(e.LOCAL_INBOX_URL),
      auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASSWORD ?? "" } : undefined,
    });
  }
  return globalForMail.rootbankMail;
}

/** Sends one e-mail through the configured SMTP server; returns the server's message id. */
export async function sendMail(mail: Mail): Promise<string> {
  const info = await transport().sendMail({ from: env().MAIL_FROM, ...mail });
  return info.messageId;
}
