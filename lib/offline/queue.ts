"use client";

import { openDB, type DBSchema, type IDBPDatabase } from "idb";

/** What a worker logs; each kind goes to its own REST collection. */
export type EntryKind = "rain" | "irrigation" | "soil";

export const ENTRY_PATHS: Record<EntryKind, string> = {
  rain: "rain-readings",
  irrigation: "irrigation-events",
  soil: "soil-checks",
};

/**
 * One entry kept on the device until the server has it. `id` is the client-chosen uuid the API stores
 * the row under, so sending it again after a lost answer cannot store it twice.
 */
export interface QueuedEntry {
  id: string;
  farmId: string;
  /** who logged it: entries are only ever sent with that person's session */
  userId: string;
  kind: EntryKind;
  /** the JSON body (with `id`), or the text parts of the multipart form when there is a photo */
  body: Record<string, string | number | boolean | null>;
  photo: Blob | null;
  photoName: string | null;
  /** one line for the list, e.g. "North gauge · 12.5 mm" */
  summary: string;
  status: "pending" | "rejected" | "sent";
  attempts: number;
  /** epoch ms before which no retry is made (backoff) */
  nextTryAt: number;
  createdAt: number;
  sentAt: number | null;
  /** the server's refusal, kept so the worker can fix or discard the entry */
  error: { status: number; message: string; fields: Record<string, string> } | null;
}

interface QueueDb extends DBSchema {
  entries: { key: string; value: QueuedEntry; indexes: { byFarm: string } };
}

const DB_NAME = "rootbank-offline";
let opening: Promise<IDBPDatabase<QueueDb>> | null = null;

function database(): Promise<IDBPDatabase<QueueDb>> {
  opening ??= openDB<QueueDb>(DB_NAME, 1, {
    upgrade(db) {
      const store = db.createObjectStore("entries", { keyPath: "id" });
      store.createIndex("byFarm", "farmId");
    },
  });
  return opening;
}

/** A uuid for a new entry; crypto.randomUUID needs a secure context, so fall back to random bytes. */
export function newEntryId(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6]! & 0x0f) | 0x40;
  b[8] = (b[8]! & 0x3f) | 0x80;
  const h = Array.from(b, (x) => x.toString(16).padStart(2, "0")).join("");
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

export async function putEntry(entry: QueuedEntry): Promise<void> {
  await (await database()).put("entries", entry);
}

export async function getEntry(id: string): Promise<QueuedEntry | undefined> {
  return (await database()).get("entries", id);
}

export async function deleteEntry(id: string): Promise<void> {
  await (await database()).delete("entries", id);
}

/** The farm's entries made by this person, oldest first. */
export async function listEntries(farmId: string, userId: string): Promise<QueuedEntry[]> {
  const all = await (await database()).getAllFromIndex("entries", "byFarm", farmId);
  return all.filter((e) => e.userId === userId).sort((a, b) => a.createdAt - b.createdAt);
}

/** Sent entries stay a day as the worker's receipt, then go; unsent ones stay until sent or discarded. */
const KEEP_SENT_MS = 24 * 3600 * 1000;

export async function pruneSent(now = Date.now()): Promise<void> {
  const db = await database();
  const all = await db.getAll("entries");
  await Promise.all(all.filter((e) => e.status === "sent" && e.sentAt !== null && now - e.sentAt > KEEP_SENT_MS).map((e) => db.delete("entries", e.id)));
}
