import type { Mail } from "@/lib/mail/send";

/** What the service worker receives: everything it needs to show the alert and open the right page. */
export interface PushPayload {
  title: string;
  body: string;
  /** app path to open on a tap, always same-origin */
  url: string;
  /** one notification per alert on the device: a retry replaces rather than repeats */
  tag: string;
  notificationId: string;
  farmId: string;
}

interface AlertText {
  id: string;
  farmId: string;
  title: string;
  body: string;
  url: string;
}

export function pushPayload(n: AlertText): PushPayload {
  return { title: n.title, body: n.body, url: n.url, tag: `rootbank-${n.id}`, notificationId: n.id, farmId: n.farmId };
}

const FOOTER = [
  "",
  "Rootbank's figures are estimates from the field's water account: confirm with a field check, and follow local water rules and licensed advice.",
  "Change which alerts you get, quiet hours or the daily digest on the alerts page of the farm.",
];

export function alertMail(to: string, farmName: string, n: AlertText, appUrl: string): Mail {
  return {
    to,
    subject: `${farmName}: ${n.title}`,
    text: [n.body, "", `Open it: ${appUrl}${n.url}`, ...FOOTER].join("\n"),
  };
}

export function digestMail(to: string, farmName: string, alerts: readonly AlertText[], appUrl: string): Mail {
  return {
    to,
    subject: `${farmName}: daily digest, ${alerts.length} alert${alerts.length === 1 ? "" : "s"}`,
    text: [
      `Alerts on ${farmName} since the last digest:`,
      "",
      ...alerts.flatMap((a) => [`- ${a.title}`, `  ${a.body}`, `  ${appUrl}${a.url}`]),
      ...FOOTER,
    ].join("\n"),
  };
}
