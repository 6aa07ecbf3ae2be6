"use client";

import Link from "next/link";
import { useSWRConfig } from "swr";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { sendJson } from "@/lib/client/fetcher";
import { ALERT_KIND_INFO } from "@/lib/alerts/rules";
import { notificationsKey, unreadKey, useNotifications, type NotificationDto } from "@/lib/client/use-alerts";

/** The in-app centre: the same alerts a phone gets by push, for every device, newest first. */
export function AlertCentre({ farmId }: { farmId: string }) {
  const { data, error, isLoading } = useNotifications(farmId);
  const { mutate } = useSWRConfig();
  const refresh = () => Promise.all([mutate(notificationsKey(farmId)), mutate(unreadKey(farmId))]);

  async function markRead(n: NotificationDto) {
    if (n.readAt) return;
    await sendJson(`/api/v1/farms/${farmId}/notifications/${n.id}`, "PATCH", { read: true }).catch(() => undefined);
    await refresh();
  }

  if (error) return <Notice tone="problem">{(error as Error).message}</Notice>;
  if (isLoading || !data) return <p className="text-ink/70">Loading alerts…</p>;
  return (
    <section aria-labelledby="alert-centre-title" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="alert-centre-title" className="text-xl font-bold">
          Recent alerts {data.unread > 0 && <span className="text-base font-normal text-ink/80">({data.unread} unread)</span>}
        </h2>
        {data.unread > 0 && (
          <Button
            variant="secondary"
            onClick={async () => {
              await sendJson(`/api/v1/farms/${farmId}/notifications/read-all`, "POST");
              await refresh();
            }}
          >
            Mark all read
          </Button>
        )}
      </div>
      {data.data.length === 0 ? (
        <p className="rounded-xl bg-white p-4 ring-1 ring-river-100">No alerts yet. When a field needs water, rain may save a set, or a gauge goes quiet, it shows here.</p>
      ) : (
        <ul className="flex flex-col gap-2" data-testid="alert-list">
          {data.data.map((n) => (
            <li key={n.id}>
              <Link
                href={n.url}
                onClick={() => void markRead(n)}
                className={`tap block rounded-xl p-3 ring-1 ${n.readAt ? "bg-white ring-river-100" : "bg-river-50 ring-river-300"}`}
              >
                <span className="flex items-start justify-between gap-2">
                  <span className="font-bold">
                    {!n.readAt && <span className="sr-only">Unread: </span>}
                    {n.title}
                  </span>
                  <span className="shrink-0 text-sm text-ink/80">{n.localDate}</span>
                </span>
                <span className="mt-1 block text-sm text-ink/80">{n.body}</span>
                <span className="mt-1 block text-xs font-bold uppercase tracking-wide text-river-700">{ALERT_KIND_INFO[n.kind].label}</span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
