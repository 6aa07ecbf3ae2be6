import type { Metadata } from "next";
import Link from "next/link";
import { SetPasswordForm } from "@/components/auth/set-password-form";
import { Notice } from "@/components/ui/notice";
import { findInvitationByToken } from "@/lib/auth/invitations";
import { ROLE_LABELS } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Join a farm" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await findInvitationByToken(token);
  if (!invitation) {
    return (
      <Notice tone="problem">
        This invitation link has expired or was already used. Ask the farm&apos;s owner or manager for a new one, or{" "}
        <Link href="/sign-in" className="underline">sign in</Link>.
      </Notice>
    );
  }
  return (
    <>
      <h1 className="mb-2 text-xl font-bold">Join {invitation.farmName}</h1>
      <p className="mb-4 text-ink/80">You are invited as {ROLE_LABELS[invitation.role].toLowerCase()}.</p>
      <SetPasswordForm token={token} mode="invite" email={invitation.email} />
    </>
  );
}
