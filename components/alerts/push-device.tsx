"use client";

import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { fetchJson, sendJson } from "@/lib/client/fetcher";

type State = "checking" | "unsupported" | "denied" | "off" | "on" | "busy";

/** The Push API wants the VAPID key as bytes; the server hands it out base64url-encoded. */
function keyBytes(base64url: string): Uint8Array<ArrayBuffer> {
  const b64 = base64url.replace(/-/g, "+").replace(/_/g, "/").padEnd(Math.ceil(base64url.length / 4) * 4, "=");
  const raw = atob(b64);
  const out = new Uint8Array(new ArrayBuffer(raw.length));
  for (let i = 0; i < raw.length; i++) out[i] = raw.charCodeAt(i);
  return out;
}

/** Whether this browser can take pushes, and whether it already does. */
async function detect(): Promise<State> {
  if (!("serviceWorker" in navigator) || !("PushManager" in window) || !("Notification" in window)) return "unsupported";
  if (Notification.permission === "denied") return "denied";
  try {
    const reg = await navigator.serviceWorker.ready;
    return (await reg.pushManager.getSubscription()) ? "on" : "off";
  } catch {
    return "off";
  }
}

/** Subscribe or unsubscribe this browser to alerts by push. Each device is its own subscription. */
export function PushDevice() {
  const [state, setState] = useState<State>("checking");
  const [problem, setProblem] = useState<string | null>(null);

  useEffect(() => {
    void detect().then(setState);
  }, []);

  async function turnOn() {
    setProblem(null);
    setState("busy");
    try {
      if ((await Notification.requestPermission()) !== "granted") {
        setState("denied");
        return;
      }
      const { publicKey } = await fetchJson<{ publicKey: string }>("/api/v1/push/public-key");
      const reg = await navigator.serviceWorker.ready;
      const sub = await reg.pushManager.subscribe({ userVisibleOnly: true, applicationServerKey: keyBytes(publicKey) });
      await sendJson("/api/v1/push/subscriptions", "POST", { ...sub.toJSON(), label: navigator.userAgent.slice(0, 80) });
      setState("on");
    } catch (err) {
      setProblem(err instanceof Error ? err.message : "This browser could not subscribe.");
      setState("off");
    }
  }

  async function turnOff() {
    setProblem(null);
    setState("busy");
    try {
      const reg = await navigator.serviceWorker.ready;
      const sub = await reg.pushManager.getSubscription();
      if (sub) {
        await sendJson("/api/v1/push/subscriptions", "DELETE", { endpoint: sub.endpoint }).catch(() => undefined);
        await sub.unsubscribe();
      }
      setState("off");
    } catch (err) {
      setProblem(err instanceof Error ? err.message : "Could not unsubscribe.");
      setState("on");
    }
  }

  return (
    <div className="flex flex-col gap-2 rounded-xl bg-white p-4 ring-1 ring-river-100">
      <h3 className="text-lg font-bold">Pushes on this device</h3>
      {state === "unsupported" && <p>This browser cannot receive pushes. Alerts still appear here and, if you choose, by e-mail.</p>}
      {state === "denied" && <p>Notifications are blocked for Rootbank in this browser&apos;s settings. Allow them there to get pushes.</p>}
      {state === "on" && (
        <>
          <p>This device gets your alerts as notifications.</p>
          <Button variant="secondary" onClick={() => void turnOff()}>
            Stop pushes on this device
          </Button>
        </>
      )}
      {(state === "off" || state === "busy" || state === "checking") && (
        <>
          <p>Get alerts on this device even when Rootbank is closed.</p>
          <Button onClick={() => void turnOn()} disabled={state !== "off"}>
            {state === "busy" ? "Working…" : "Send alerts to this device"}
          </Button>
        </>
      )}
      {problem && <Notice tone="problem">{problem}</Notice>}
    </div>
  );
}
