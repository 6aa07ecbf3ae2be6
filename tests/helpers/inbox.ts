export interface CapturedMail {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

function inboxUrl(): string {
  const url = process.env.LOCAL_INBOX_URL;
  if (!url) throw new Error("LOCAL_INBOX_URL is not set; run the tests through `npm test`, which starts the inbox.");
  return url;
}

export async function mailsTo(address: string): Promise<CapturedMail[]> {
  const res = await fetch(`${inboxUrl()}/messages?to=${encodeURIComponent(address)}`);
  return (await res.json()) as CapturedMail[];
}

/** Waits until the local SMTP inbox has a message to `address` whose subject matches. */
export async function waitForMail(address: string, subject: RegExp, timeoutMs = 10_000): Promise<CapturedMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await mailsTo(address)).find((m) => subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no e-mail to ${address} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export function linkIn(mail: CapturedMail, pathPrefix: string): string {
  const match = new RegExp(`https?://\\S+${pathPrefix}\\S+`).exec(mail.text);
  if (!match) throw new Error(`no ${pathPrefix} link in "${mail.subject}"`);
  return match[0];
}
