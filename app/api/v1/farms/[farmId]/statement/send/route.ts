import { hitRateLimit } from "@/db/rate-limits";
import { memberEmail } from "@/db/statement";
import { AppError } from "@/lib/api/errors";
import { readJson, withFarmRole } from "@/lib/api/handler";
import { sendMail } from "@/lib/mail/send";
import { statementMail } from "@/lib/mail/templates";
import { periodTitle } from "@/lib/statement/format";
import { statementPdf } from "@/lib/statement/pdf";
import { farmStatement, fileNameOf } from "@/lib/statement/respond";
import { statementSendSchema } from "@/lib/validation/statement";

/** Statements one person may send per hour (common practice, no source): enough for a busy day, not for a mail cannon. */
const SENDS_PER_HOUR = 20;

// POST /api/v1/farms/:farmId/statement/send — e-mail the statement as a PDF to the sender or another member of the farm
export const POST = withFarmRole("readStatement", async ({ req, farmId, user }) => {
  const { to, ...selection } = await readJson(req, statementSendSchema);
  const recipient = to === undefined ? user.email : await memberEmail(farmId, to);
  if (!recipient) throw new AppError("invalid", "Statements go to members of this farm only.", { to: "No member of this farm has that e-mail address" });
  const limit = await hitRateLimit(`statement-send:${user.id}`, 3600, SENDS_PER_HOUR);
  if (!limit.allowed) {
    throw new AppError("rate_limited", "Too many statements sent in the last hour; try again later.", undefined, { "Retry-After": String(limit.retryAfterS) });
  }
  const s = await farmStatement(farmId, selection);
  const pdf = await statementPdf(s);
  const what = `${periodTitle(s.period)}${s.field ? `, ${s.field.name}` : ""}`;
  await sendMail(statementMail(recipient, s.farm.name, what, user.name, { filename: fileNameOf(s, "pdf"), content: pdf }));
  return { sent: true, to: recipient, filename: fileNameOf(s, "pdf"), bytes: pdf.length };
});
