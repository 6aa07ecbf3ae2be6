"use client";

import { ENTRY_PATHS, getEntry, listEntries, pruneSent, putEntry, type QueuedEntry } from "./queue";

/*
 * Sends queued entries to the REST API. Every entry carries its client uuid, and the API answers a repeat
 * with the stored row (200), so an entry whose answer was lost on the way back is simply sent again.
 * Network failures and server trouble (5xx, 408, 429) are retried with backoff; any other 4xx is the
 * server refusing the entry itself, which stays on the device with the server's reason.
 */

const FIRST_RETRY_MS = 5_000;
const MAX_RETRY_MS = 5 * 60_000;
const RETRY_STATUSES = new Set([401, 408, 425, 429]);

type Outcome = { kind: "sent" } | { kind: "retry"; note: string } | { kind: "rejected"; status: number; message: string; fields: Record<string, string> };

const listeners = new Set<() => void>();
let running: Promise<void> | null = null;
let forceAgain = false;
let timer: ReturnType<typeof setTimeout> | null = null;

/** Calls `fn` whenever an entry changes state on this page. */
export function onQueueChange(fn: () => void): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

export function notifyQueueChange(): void {
  for (const fn of listeners) fn();
}

/** Delay before the n-th retry: doubling from 5 s to at most 5 min, with jitter so phones do not retry in step. */
export function retryDelayMs(attempts: number, random = Math.random): number {
  const base = Math.min(MAX_RETRY_MS, FIRST_RETRY_MS * 2 ** Math.max(0, attempts - 1));
  return Math.round(base * (0.8 + 0.4 * random()));
}

function request(entry: QueuedEntry): RequestInit {
  if (!entry.photo) {
    return { method: "POST", headers: { "Content-Type": "application/json", Accept: "application/json" }, body: JSON.stringify(entry.body) };
  }
  const form = new FormData();
  for (const [key, value] of Object.entries(entry.body)) {
    if (value !== null && value !== undefined) form.set(key, String(value));
  }
  form.set("photo", entry.photo, entry.photoName ?? "photo.jpg");
  return { method: "POST", headers: { Accept: "application/json" }, body: form };
}

async function send(entry: QueuedEntry): Promise<Outcome> {
  let res: Response;
  try {
    res = await fetch(`/api/v1/farms/${entry.farmId}/${ENTRY_PATHS[entry.kind]}`, request(entry));
  } catch {
    return { kind: "retry", note: "No connection: it will be sent when the phone is back online." };
  }
  if (res.ok) return { kind: "sent" };
  let message = `The server answered ${res.status}.`;
  let fields: Record<string, string> = {};
  try {
    const body = (await res.json()) as { error?: { message?: string; fields?: Record<string, string> } };
    message = body.error?.message ?? message;
    fields = body.error?.fields ?? {};
  } catch {
    // A proxy's HTML error page: keep the status line.
  }
  if (res.status === 401) return { kind: "retry", note: "Signed out: sign in again and it will be sent." };
  if (res.status >= 500 || RETRY_STATUSES.has(res.status)) return { kind: "retry", note: message };
  return { kind: "rejected", status: res.status, message, fields };
}

async function sendOne(id: string): Promise<void> {
  const entry = await getEntry(id);
  if (!entry || entry.status !== "pending") return;
  const outcome = await send(entry);
  // Re-read: the worker may have discarded or edited the entry while it was on the way.
  const now = await getEntry(id);
  if (!now) return;
  if (outcome.kind === "sent") {
    await putEntry({ ...now, status: "sent", sentAt: Date.now(), error: null, photo: null });
  } else if (outcome.kind === "rejected") {
    await putEntry({ ...now, status: "rejected", attempts: now.attempts + 1, error: { status: outcome.status, message: outcome.message, fields: outcome.fields } });
  } else {
    const attempts = now.attempts + 1;
    await putEntry({ ...now, attempts, nextTryAt: Date.now() + retryDelayMs(attempts), error: { status: 0, message: outcome.note, fields: {} } });
  }
  notifyQueueChange();
}

function schedule(farmId: string, userId: string, entries: QueuedEntry[]): void {
  if (timer) clearTimeout(timer);
  timer = null;
  const waits = entries.filter((e) => e.status === "pending").map((e) => e.nextTryAt - Date.now());
  if (waits.length === 0) return;
  timer = setTimeout(() => void flushQueue(farmId, userId), Math.max(1_000, Math.min(...waits)));
}

async function flushOnce(farmId: string, userId: string, force: boolean): Promise<void> {
  try {
    if (typeof navigator !== "undefined" && navigator.onLine === false) return;
    const due = (await listEntries(farmId, userId)).filter((e) => e.status === "pending" && (force || e.nextTryAt <= Date.now()));
    for (const e of due) await sendOne(e.id);
    await pruneSent();
  } finally {
    schedule(farmId, userId, await listEntries(farmId, userId));
  }
}

/**
 * Sends this person's pending entries for the farm, one at a time and oldest first. `force` ignores the
 * backoff (the connection just came back, or the worker pressed "send now"). One pass runs at a time; a
 * forced call during a pass gets one more forced pass after it, so a connection that comes back while the
 * previous pass was still finding none is not missed.
 */
export function flushQueue(farmId: string, userId: string, force = false): Promise<void> {
  if (running) {
    forceAgain ||= force;
    return running;
  }
  const pass: Promise<void> = flushOnce(farmId, userId, force).finally(() => {
    running = null;
    if (forceAgain) {
      forceAgain = false;
      void flushQueue(farmId, userId, true);
    }
  });
  running = pass;
  return pass;
}
