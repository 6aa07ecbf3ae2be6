"use client";

import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";
import { sendJson } from "@/lib/client/fetcher";
import { useFormSubmit } from "./use-form-submit";

/** Sets a password from an e-mailed link: a reset, or accepting an invitation (which also asks a name). */
export function SetPasswordForm({ token, mode, email }: { token: string; mode: "reset" | "invite"; email?: string }) {
  const router = useRouter();
  const { busy, error, fields, onSubmit } = useFormSubmit(
    (form) =>
      mode === "reset"
        ? sendJson("/api/v1/password-resets/confirm", "POST", { token, password: form.get("password") })
        : sendJson("/api/v1/invitations/accept", "POST", { token, name: form.get("name"), password: form.get("password") }),
    () => router.push(mode === "reset" ? "/sign-in?reset=done" : `/sign-in?joined=1`),
  );
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      {error && <Notice tone="problem">{error}</Notice>}
      {email && <p className="text-sm">Account: <strong>{email}</strong></p>}
      {mode === "invite" && <TextField id="name" name="name" label="Your name" autoComplete="name" error={fields.name} required />}
      <TextField
        id="password"
        name="password"
        type="password"
        label={mode === "reset" ? "New password" : "Choose a password"}
        autoComplete="new-password"
        hint="At least 10 characters."
        error={fields.password}
        required
      />
      <Button type="submit" disabled={busy}>
        {busy ? "Saving…" : mode === "reset" ? "Change password" : "Join the farm"}
      </Button>
    </form>
  );
}
