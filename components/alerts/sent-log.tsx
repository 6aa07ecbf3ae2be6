"use client";

import { Notice } from "@/components/ui/notice";
import { useDeliveryLog } from "@/lib/client/use-alerts";

const STATUS: Record<string, string> = { pending: "waiting", sent: "delivered", failed: "failed", gone: "device gone" };

/** What went out to the farm's people, by which way, and how it ended. */
export function SentLog({ farmId }: { farmId: string }) {
  const { data, error } = useDeliveryLog(farmId, true);
  if (error) return <Notice tone="problem">{(error as Error).message}</Notice>;
  if (!data) return <p className="text-ink/70">Loading the sent log…</p>;
  if (data.data.length === 0) return <p>Nothing sent yet.</p>;
  return (
    <ul className="flex flex-col gap-1 text-sm">
      {data.data.map((d) => (
        <li key={d.id} className="rounded-lg bg-white p-2 ring-1 ring-river-100">
          <span className="font-bold">{d.userName}</span> · {d.channel} to {d.target} · <span className="font-bold">{STATUS[d.status]}</span>
          {d.attempts > 1 && ` after ${d.attempts} attempts`}
          <span className="block text-ink/80">{d.title}</span>
          {d.lastError && d.status !== "sent" && <span className="block text-clay-700">{d.lastError}</span>}
        </li>
      ))}
    </ul>
  );
}
