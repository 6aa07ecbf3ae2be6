/**
 * public/sw-alerts.js run in a stand-in service worker scope: what a push shows, and which page a tap
 * opens. The browser side (a real push reaching a real worker) is tests/e2e/alerts.spec.ts.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import vm from "node:vm";
import { describe, expect, it } from "vitest";

const ORIGIN = "https://rootbank.example";
type Listener = (event: Record<string, unknown>) => void;

function loadWorker(windows: { url: string; navigate?: (u: string) => Promise<unknown>; focus: () => Promise<unknown> }[] = []) {
  const listeners = new Map<string, Listener>();
  const shown: { title: string; options: Record<string, unknown> }[] = [];
  const opened: string[] = [];
  const self = {
    location: { origin: ORIGIN },
    addEventListener: (type: string, fn: Listener) => listeners.set(type, fn),
    registration: { showNotification: async (title: string, options: Record<string, unknown>) => void shown.push({ title, options }) },
    clients: { matchAll: async () => windows, openWindow: async (url: string) => void opened.push(url) },
  };
  const context = vm.createContext({ self, URL, JSON });
  vm.runInContext(readFileSync(path.resolve("public/sw-alerts.js"), "utf8"), context);
  const target = context.rootbankAlertTarget as (data: unknown, origin: string) => string;
  async function fire(type: string, event: Record<string, unknown>) {
    let wait: Promise<unknown> = Promise.resolve();
    listeners.get(type)!({ ...event, waitUntil: (p: Promise<unknown>) => (wait = p) });
    await wait;
  }
  return { target, fire, shown, opened };
}

describe("the alert tap target", () => {
  const { target } = loadWorker();

  it("opens the path the alert names, on this origin", () => {
    expect(target({ url: "/farms/f1/fields/a1" }, ORIGIN)).toBe(`${ORIGIN}/farms/f1/fields/a1`);
  });

  it("refuses other hosts, protocol-relative and script URLs", () => {
    for (const url of ["https://elsewhere.example/x", "//elsewhere.example/x", "javascript:alert(1)", 42, undefined]) {
      expect(target({ url }, ORIGIN)).toBe(`${ORIGIN}/farms`);
    }
    expect(target(null, ORIGIN)).toBe(`${ORIGIN}/farms`);
  });
});

describe("push and notificationclick", () => {
  it("shows the payload's title and body with the alert's tag", async () => {
    const w = loadWorker();
    const payload = { title: "North block needs water", body: "Depletion 42 mm", url: "/farms/f/fields/n", tag: "rootbank-1", notificationId: "1", farmId: "f" };
    await w.fire("push", { data: { text: () => JSON.stringify(payload) } });
    expect(w.shown).toHaveLength(1);
    expect(w.shown[0]).toMatchObject({ title: payload.title, options: { body: payload.body, tag: "rootbank-1", data: { url: "/farms/f/fields/n" } } });
  });

  it("still says something for a payload that is not Rootbank's JSON", async () => {
    const w = loadWorker();
    await w.fire("push", { data: { text: () => "plain words" } });
    expect(w.shown[0]).toMatchObject({ title: "Rootbank", options: { body: "plain words" } });
  });

  it("opens a new window on the field when no Rootbank window is open", async () => {
    const w = loadWorker();
    let closed = false;
    await w.fire("notificationclick", { notification: { data: { url: "/farms/f/fields/n" }, close: () => (closed = true) } });
    expect(closed).toBe(true);
    expect(w.opened).toEqual([`${ORIGIN}/farms/f/fields/n`]);
  });

  it("moves an open window to the field and focuses it", async () => {
    const visits: string[] = [];
    let focused = false;
    const win = { url: `${ORIGIN}/farms/f`, navigate: async (u: string) => (visits.push(u), win), focus: async () => (focused = true) };
    const w = loadWorker([win]);
    await w.fire("notificationclick", { notification: { data: { url: "/farms/f/fields/n" }, close: () => undefined } });
    expect(visits).toEqual([`${ORIGIN}/farms/f/fields/n`]);
    expect(focused).toBe(true);
    expect(w.opened).toEqual([]);
  });
});
