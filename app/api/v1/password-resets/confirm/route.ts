import { readJson, withErrors } from "@/lib/api/handler";
import { confirmPasswordReset } from "@/lib/auth/password-reset";
import { resetConfirmSchema } from "@/lib/validation/auth";

// POST /api/v1/password-resets/confirm — set a new password with the e-mailed token
export const POST = withErrors(async (req) => {
  const { token, password } = await readJson(req, resetConfirmSchema);
  await confirmPasswordReset(token, password);
});
