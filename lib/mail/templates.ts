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
