/**
 * The phone's queue of logged entries (lib/offline/sync.ts) on a real IndexedDB implementation
 * (fake-indexeddb): an entry saved offline waits, is sent exactly once when the connection returns, and
 * a refusal stays on the device with the server's reason. The server here is a stub of the REST API's
 * documented answers (201 created, 422 with fields).
 */
import "fake-indexeddb/auto";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { listEntries, putEntry, type QueuedEntry } from "@/lib/offline/queue";
import { flushQueue, retryDelayMs } from "@/lib/offline/sync";

const FARM = "farm-1";
const USER = "user-1";
let online = true;
let posts: { url: string; body: unknown }[] = [];
let answer: (body: Record<string, unknown>) => Response = () => Response.json({}, { status: 201 });

function entry(id: string, extra: Partial<QueuedEntry> = {}): QueuedEntry {
  return {
    id, farmId: FARM, userId: USER, kind: "rain", body: { id, gaugeId: "g", readAt: "2026-11-30T09:00:00+11:00", depthMm: 12.5 },
    photo: null, photoName: null, summary: "Rain 12.5 mm", status: "pending", attempts: 0, nextTryAt: 0, createdAt: Date.now(), sentAt: null, error: null, ...extra,
  };
}

beforeEach(() => {
  online = true;
  posts = [];
  answer = () => Response.json({}, { status: 201 });
  vi.stubGlobal("navigator", { get onLine() { return online; } });
  vi.stubGlobal("fetch", async (url: string, init: RequestInit) => {
    if (!online) throw new TypeError("Failed to fetch");
    const body = JSON.parse(String(init.body)) as Record<string, unknown>;
    posts.push({ url, body });
    return answer(body);
  });
});

afterEach(async () => {
  vi.unstubAllGlobals();
  // let the scheduled retry timers of this test fire into nothing
  vi.useRealTimers();
});

const statusOf = async (id: string) => (await listEntries(FARM, USER)).find((e) => e.id === id)?.status;

describe("the phone's queue", () => {
  it("keeps an entry made offline, then sends it once when the connection returns", async () => {
    online = false;
    await putEntry(entry("a1"));
    await flushQueue(FARM, USER, true); // saved offline: nothing leaves the phone
    await flushQueue(FARM, USER, true); // "try sending now" while still offline
    expect(posts).toHaveLength(0);
    expect(await statusOf("a1")).toBe("pending");

    online = true;
    await flushQueue(FARM, USER, true); // the browser's online event
    await flushQueue(FARM, USER, true); // and a reload right after
    expect(posts.map((p) => p.url)).toEqual([`/api/v1/farms/${FARM}/rain-readings`]);
    expect(posts[0]!.body).toMatchObject({ id: "a1", depthMm: 12.5 });
    expect(await statusOf("a1")).toBe("sent");
  });

  it("runs one more forced pass when the connection returns during a pass", async () => {
    online = false;
    await putEntry(entry("b1"));
    const first = flushQueue(FARM, USER, false);
    online = true;
    const second = flushQueue(FARM, USER, true); // arrives while the first pass is still running
    await Promise.all([first, second]);
    await vi.waitFor(async () => expect(await statusOf("b1")).toBe("sent"));
    expect(posts.filter((p) => (p.body as { id: string }).id === "b1")).toHaveLength(1);
  });

  it("keeps a refused entry with the server's reason and does not send it again", async () => {
    answer = () => Response.json({ error: { code: "invalid", message: "Some values are not valid.", fields: { depthMm: "More than 1000 mm in a day is not a plausible reading" } } }, { status: 422 });
    await putEntry(entry("c1", { body: { id: "c1", gaugeId: "g", readAt: "2026-11-30T09:00:00+11:00", depthMm: 1500 } }));
    await flushQueue(FARM, USER, true);
    await flushQueue(FARM, USER, true);
    const refused = (await listEntries(FARM, USER)).find((e) => e.id === "c1")!;
    expect(refused.status).toBe("rejected");
    expect(refused.error).toEqual({ status: 422, message: "Some values are not valid.", fields: { depthMm: "More than 1000 mm in a day is not a plausible reading" } });
    expect(posts.filter((p) => (p.body as { id: string }).id === "c1")).toHaveLength(1);
  });

  it("backs off between retries, doubling from 5 s to at most 5 min with ±20 % jitter", () => {
    expect(retryDelayMs(1, () => 0.5)).toBe(5_000);
    expect(retryDelayMs(3, () => 0.5)).toBe(20_000);
    expect(retryDelayMs(20, () => 0.5)).toBe(300_000);
    expect(retryDelayMs(1, () => 0)).toBe(4_000);
    expect(retryDelayMs(1, () => 1)).toBe(6_000);
  });
});
