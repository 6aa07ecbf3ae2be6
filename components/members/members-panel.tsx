"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";
import { useFormSubmit } from "@/components/auth/use-form-submit";
import { assignableRoles, ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { ApiError, sendJson } from "@/lib/client/fetcher";
import { useInvitations, useMembers } from "@/lib/client/use-members";

export function MembersPanel({ farmId, myRole, myUserId }: { farmId: string; myRole: Role; myUserId: string }) {
  const members = useMembers(farmId);
  const invitations = useInvitations(farmId);
  const roles = assignableRoles(myRole);
  const [message, setMessage] = useState<{ tone: "success" | "problem"; text: string } | null>(null);

  const invite = useFormSubmit(
    (form) => sendJson(`/api/v1/farms/${farmId}/invitations`, "POST", { email: form.get("email"), role: form.get("role") }),
    () => {
      setMessage({ tone: "success", text: "Invitation sent. The link in the e-mail is valid for 7 days." });
      void invitations.mutate();
    },
  );

  async function act(run: () => Promise<unknown>, done: string) {
    setMessage(null);
    try {
      await run();
      setMessage({ tone: "success", text: done });
    } catch (err) {
      setMessage({ tone: "problem", text: err instanceof ApiError ? err.message : "The change could not be saved." });
    }
    await Promise.all([members.mutate(), invitations.mutate()]);
  }

  return (
    <div className="flex flex-col gap-6">
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      {members.error && <Notice tone="problem">{(members.error as Error).message}</Notice>}

      <section aria-labelledby="members-heading" className="flex flex-col gap-3">
        <h2 id="members-heading" className="text-lg font-bold">
          Members
        </h2>
        {members.isLoading && <p className="text-ink/70">Loading members…</p>}
        <ul className="divide-y divide-river-100 rounded-2xl bg-white ring-1 ring-river-100">
          {members.data?.data.map((m) => {
            const mayHandle = m.userId !== myUserId && roles.includes(m.role);
            return (
              <li key={m.userId} className="flex flex-wrap items-center gap-3 px-4 py-3">
                <div className="min-w-0 flex-1">
                  <p className="font-bold">{m.name}</p>
                  <p className="truncate text-sm text-ink/70">{m.email}</p>
                </div>
                {mayHandle ? (
                  <>
                    <label className="sr-only" htmlFor={`role-${m.userId}`}>
                      Role of {m.name}
                    </label>
                    <select
                      id={`role-${m.userId}`}
                      className="tap rounded-xl border border-river-300 bg-white px-2"
                      value={m.role}
                      onChange={(e) =>
                        void act(
                          () => sendJson(`/api/v1/farms/${farmId}/members/${m.userId}`, "PATCH", { role: e.target.value }),
                          `${m.name} is now ${ROLE_LABELS[e.target.value as Role].toLowerCase()}.`,
                        )
                      }
                    >
                      {roles.map((r) => (
                        <option key={r} value={r}>
                          {ROLE_LABELS[r]}
                        </option>
                      ))}
                    </select>
                    <Button
                      variant="danger"
                      onClick={() => {
                        if (!window.confirm(`Remove ${m.name} from this farm? Their past entries stay in the records.`)) return;
                        void act(() => sendJson(`/api/v1/farms/${farmId}/members/${m.userId}`, "DELETE"), `${m.name} was removed from the farm.`);
                      }}
                    >
                      Remove
                    </Button>
                  </>
                ) : (
                  <span className="text-sm font-bold text-ink/80">{ROLE_LABELS[m.role]}</span>
                )}
              </li>
            );
          })}
        </ul>
      </section>

      <section aria-labelledby="invite-heading" className="flex flex-col gap-3">
        <h2 id="invite-heading" className="text-lg font-bold">
          Invite someone
        </h2>
        <form onSubmit={invite.onSubmit} className="flex flex-col gap-3 rounded-2xl bg-white p-4 ring-1 ring-river-100" noValidate>
          {invite.error && <Notice tone="problem">{invite.error}</Notice>}
          <TextField id="invite-email" name="email" type="email" label="E-mail" error={invite.fields.email} required />
          <div className="flex flex-col gap-1">
            <label htmlFor="invite-role" className="text-sm font-bold">
              Role
            </label>
            <select id="invite-role" name="role" className="tap rounded-xl border border-river-300 bg-white px-2" defaultValue={roles.at(-1)}>
              {roles.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </div>
          <Button type="submit" disabled={invite.busy}>
            {invite.busy ? "Sending…" : "Send invitation"}
          </Button>
        </form>
        {(invitations.data?.data.length ?? 0) > 0 && (
          <ul className="flex flex-col gap-2">
            {invitations.data?.data.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center gap-3 rounded-xl bg-river-50 px-4 py-2">
                <span className="min-w-0 flex-1 truncate">
                  {i.email} · {ROLE_LABELS[i.role]} · waiting until {i.expiresAt.slice(0, 10)}
                </span>
                <Button
                  variant="quiet"
                  onClick={() => void act(() => sendJson(`/api/v1/farms/${farmId}/invitations/${i.id}`, "DELETE"), "Invitation withdrawn.")}
                >
                  Withdraw
                </Button>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
