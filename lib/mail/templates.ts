import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import type { Mail } from "./send";

export function invitationMail(to: string, farmName: string, role: Role, inviter: string, link: string): Mail {
  return {
    to,
    subject: `${inviter} invited you to ${farmName} on Rootbank`,
    text: [
      `${inviter} invited you to join ${farmName} on Rootbank as ${ROLE_LABELS[role].toLowerCase()}.`,
      "",
      "Open this link to choose your password and join (valid for 7 days):",
      link,
      "",
      "If you did not expect this, ignore this e-mail.",
    ].join("\n"),
  };
}

export function passwordResetMail(to: string, link: string): Mail {
  return {
    to,
    subject: "Reset your Rootbank password",
    text: [
      "Someone asked to reset the password of this Rootbank account.",
      "",
      "Open this link to choose a new password (valid for 1 hour):",
      link,
      "",
      "If it was not you, ignore this e-mail; your password stays as it is.",
    ].join("\n"),
  };
}

export function statementMail(to: string, farmName: string, what: string, sender: string, pdf: { filename: string; content: Buffer }): Mail {
  return {
    to,
    subject: `Season water statement: ${farmName}, ${what}`,
    text: [
      `${sender} sent you the season water statement of ${farmName} (${what}) from Rootbank. It is attached as a PDF.`,
      "",
      "The figures are estimates from the daily water account. Confirm them with meter readings and field checks,",
      "and follow your local water rules, licence conditions and licensed advice before relying on them.",
    ].join("\n"),
    attachments: [{ filename: pdf.filename, content: pdf.content, contentType: "application/pdf" }],
  };
}
