"use client";

import { useCallback, useEffect, useState } from "react";
import { deleteEntry, getEntry, listEntries, newEntryId, putEntry, type EntryKind, type QueuedEntry } from "@/lib/offline/queue";
import { flushQueue, notifyQueueChange, onQueueChange } from "@/lib/offline/sync";

export interface NewEntry {
  kind: EntryKind;
  body: QueuedEntry["body"];
  photo?: File | null;
  summary: string;
}

/** Whether the browser believes it has a network; updates on the online/offline events. */
export function useOnline(): boolean {
  const [online, setOnline] = useState(true);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  }, []);
  return online;
}

/**
 * The person's entries on this device for one farm: pending, refused and recently sent. Logging always
 * goes through the queue, online or not, so there is one path and a lost answer is never a lost entry.
 */
export function useLogQueue(farmId: string, userId: string) {
  const [entries, setEntries] = useState<QueuedEntry[] | null>(null);

  useEffect(() => {
    const reload = () => listEntries(farmId, userId).then(setEntries);
    const stop = onQueueChange(() => void reload());
    const back = () => void flushQueue(farmId, userId, true);
    window.addEventListener("online", back);
    void reload().then(() => flushQueue(farmId, userId, true));
    return () => {
      stop();
      window.removeEventListener("online", back);
    };
  }, [farmId, userId]);

  const enqueue = useCallback(
    async (entry: NewEntry): Promise<string> => {
      const id = typeof entry.body.id === "string" ? entry.body.id : newEntryId();
      await putEntry({
        id,
        farmId,
        userId,
        kind: entry.kind,
        body: { ...entry.body, id },
        photo: entry.photo ?? null,
        photoName: entry.photo?.name ?? null,
        summary: entry.summary,
        status: "pending",
        attempts: 0,
        nextTryAt: 0,
        createdAt: Date.now(),
        sentAt: null,
        error: null,
      });
      notifyQueueChange();
      void flushQueue(farmId, userId, true);
      return id;
    },
    [farmId, userId],
  );

  const discard = useCallback(async (id: string) => {
    await deleteEntry(id);
    notifyQueueChange();
  }, []);

  /** Puts a refused entry back in line, with the worker's corrections merged into its body. */
  const resend = useCallback(
    async (id: string, changes: QueuedEntry["body"] = {}) => {
      const e = await getEntry(id);
      if (!e) return;
      await putEntry({ ...e, body: { ...e.body, ...changes }, status: "pending", attempts: 0, nextTryAt: 0, error: null });
      notifyQueueChange();
      await flushQueue(farmId, userId, true);
    },
    [farmId, userId],
  );

  const sendNow = useCallback(() => flushQueue(farmId, userId, true), [farmId, userId]);

  return { entries, enqueue, discard, resend, sendNow };
}
