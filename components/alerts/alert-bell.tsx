"use client";

import Link from "next/link";
import { useUnreadCount } from "@/lib/client/use-alerts";

/** The header's way to the alert centre, with the number of unread alerts. */
export function AlertBell({ farmId }: { farmId: string }) {
  const { data } = useUnreadCount(farmId);
  const unread = data?.unread ?? 0;
  const label = unread ? `Alerts, ${unread} unread` : "Alerts";
  return (
    <Link href={`/farms/${farmId}/alerts`} aria-label={label} className="tap relative flex items-center justify-center rounded-lg px-2 text-river-700 hover:bg-river-50">
      <svg aria-hidden="true" width="26" height="26" viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round">
        <path d="M6 8a6 6 0 0 1 12 0c0 7 3 9 3 9H3s3-2 3-9" />
        <path d="M10.3 21a1.94 1.94 0 0 0 3.4 0" />
      </svg>
      {unread > 0 && (
        <span data-testid="alert-unread" className="absolute right-0 top-1 min-w-5 rounded-full bg-clay-700 px-1 text-center text-xs font-bold leading-5 text-white">
          {unread > 99 ? "99+" : unread}
        </span>
      )}
    </Link>
  );
}
