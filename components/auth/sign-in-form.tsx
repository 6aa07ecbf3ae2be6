"use client";

import Link from "next/link";
import { useRouter, useSearchParams } from "next/navigation";
import { signIn } from "next-auth/react";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";

function messageFor(error: string): string {
  if (error === "CredentialsSignin") return "That e-mail and password do not match an account. Check both, or reset your password.";
  return error;
}

/** Only same-site paths are followed after sign-in. */
function safeCallback(value: string | null): string {
  return value && value.startsWith("/") && !value.startsWith("//") ? value : "/";
}

export function SignInForm() {
  const router = useRouter();
  const params = useSearchParams();
  const [error, setError] = useState<string | null>(params.get("error") ? messageFor(params.get("error")!) : null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    const result = await signIn("credentials", {
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      redirect: false,
    });
    setBusy(false);
    if (!result || result.error) {
      setError(messageFor(result?.error ?? "Sign-in failed; try again."));
      return;
    }
    router.replace(safeCallback(params.get("callbackUrl")));
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      {params.get("reset") === "done" && <Notice tone="success">Your password is changed. Sign in with it now.</Notice>}
      {error && <Notice tone="problem">{error}</Notice>}
      <TextField id="email" name="email" type="email" label="E-mail" autoComplete="email" required />
      <TextField id="password" name="password" type="password" label="Password" autoComplete="current-password" required />
      <Button type="submit" disabled={busy}>
        {busy ? "Signing in…" : "Sign in"}
      </Button>
      <Link href="/reset" className="text-center text-river-700 underline">
        Forgot your password?
      </Link>
    </form>
  );
}
