"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import type { QueuedEntry } from "@/lib/offline/queue";

const STATE_LABEL: Record<QueuedEntry["status"], string> = {
  pending: "Waiting to send",
  rejected: "Not accepted",
  sent: "Sent",
};

const STATE_STYLE: Record<QueuedEntry["status"], string> = {
  pending: "bg-river-50 ring-river-300",
  rejected: "bg-clay-50 ring-clay-300",
  sent: "bg-white ring-reed-500/40",
};

/** A refused entry: the server's reason, the values it named for correction, and a way to drop it. */
function Refused({ entry, onResend, onDiscard }: { entry: QueuedEntry; onResend: (changes: QueuedEntry["body"]) => void; onDiscard: () => void }) {
  const named = Object.keys(entry.error?.fields ?? {}).filter((k) => k in entry.body);
  const [draft, setDraft] = useState<Record<string, string>>(() => Object.fromEntries(named.map((k) => [k, String(entry.body[k] ?? "")])));
  const changes = (): QueuedEntry["body"] =>
    Object.fromEntries(Object.entries(draft).map(([k, v]) => [k, typeof entry.body[k] === "number" ? Number(v.replace(",", ".")) : v]));
  return (
    <div className="mt-2 flex flex-col gap-2">
      <p className="font-bold text-clay-900">The server said: {entry.error?.message}</p>
      {Object.entries(entry.error?.fields ?? {}).map(([k, msg]) => (
        <p key={k} className="text-sm text-clay-900">
          {k}: {msg}
        </p>
      ))}
      {named.map((k) => (
        <label key={k} className="flex flex-col gap-1 text-sm font-bold">
          Correct {k}
          <input
            className="tap rounded-xl border border-clay-500 bg-white px-3 py-2 text-base font-normal"
            value={draft[k] ?? ""}
            onChange={(e) => setDraft({ ...draft, [k]: e.target.value })}
          />
        </label>
      ))}
      <div className="flex flex-wrap gap-2">
        {named.length > 0 && <Button onClick={() => onResend(changes())}>Send corrected</Button>}
        <Button variant="danger" onClick={onDiscard}>
          Discard
        </Button>
      </div>
    </div>
  );
}

/** The worker's entries on this phone, newest first, each with where it stands. */
export function EntryList({
  entries,
  onResend,
  onDiscard,
  onSendNow,
}: {
  entries: QueuedEntry[];
  onResend: (id: string, changes: QueuedEntry["body"]) => void;
  onDiscard: (id: string) => void;
  onSendNow: () => void;
}) {
  if (entries.length === 0) return <p className="text-ink/70">Nothing logged on this phone today.</p>;
  const waiting = entries.filter((e) => e.status === "pending").length;
  return (
    <div className="flex flex-col gap-2">
      {waiting > 0 && (
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="font-bold">
            {waiting} {waiting === 1 ? "entry" : "entries"} kept on this phone until there is a connection.
          </p>
          <Button variant="secondary" onClick={onSendNow}>
            Try sending now
          </Button>
        </div>
      )}
      <ul className="flex flex-col gap-2" aria-label="Entries on this phone">
        {[...entries].reverse().map((e) => (
          <li key={e.id} className={`rounded-xl px-4 py-3 ring-1 ${STATE_STYLE[e.status]}`} data-entry-status={e.status}>
            <p className="text-sm font-bold uppercase tracking-wide">
              {STATE_LABEL[e.status]}
              {e.photoName && e.status !== "sent" ? " · with photo" : ""}
            </p>
            <p>{e.summary}</p>
            {e.status === "pending" && e.error && <p className="text-sm text-ink/80">{e.error.message}</p>}
            {e.status === "rejected" && <Refused entry={e} onResend={(c) => onResend(e.id, c)} onDiscard={() => onDiscard(e.id)} />}
          </li>
        ))}
      </ul>
    </div>
  );
}
