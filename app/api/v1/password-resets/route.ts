import { readJson, withErrors } from "@/lib/api/handler";
import { requestPasswordReset } from "@/lib/auth/password-reset";
import { resetRequestSchema } from "@/lib/validation/auth";

// POST /api/v1/password-resets — e-mail a reset link (the answer never says whether the account exists)
export const POST = withErrors(async (req) => {
  const { email } = await readJson(req, resetRequestSchema);
  await requestPasswordReset(email);
  return Response.json({ message: "If that address has an account, a reset link is on its way." }, { status: 202 });
});
