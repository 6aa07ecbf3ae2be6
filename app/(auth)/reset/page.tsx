import type { Metadata } from "next";
import { ResetRequestForm } from "@/components/auth/reset-request-form";

export const metadata: Metadata = { title: "Reset password" };

export default function ResetPage() {
  return (
    <>
      <h1 className="mb-2 text-xl font-bold">Reset your password</h1>
      <p className="mb-4 text-ink/80">We will e-mail you a link to choose a new one.</p>
      <ResetRequestForm />
    </>
  );
}
