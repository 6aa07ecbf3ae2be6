"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";
import { sendJson } from "@/lib/client/fetcher";
import { useFormSubmit } from "./use-form-submit";

export function ResetRequestForm() {
  const [sent, setSent] = useState<string | null>(null);
  const { busy, error, fields, onSubmit } = useFormSubmit(
    (form) => sendJson<{ message: string }>("/api/v1/password-resets", "POST", { email: form.get("email") }),
    (res) => setSent(res.message),
  );
  if (sent) return <Notice tone="success">{sent} Check your inbox, and the spam folder too.</Notice>;
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      {error && <Notice tone="problem">{error}</Notice>}
      <TextField id="email" name="email" type="email" label="E-mail" autoComplete="email" error={fields.email} required />
      <Button type="submit" disabled={busy}>
        {busy ? "Sending…" : "Send me a reset link"}
      </Button>
    </form>
  );
}
