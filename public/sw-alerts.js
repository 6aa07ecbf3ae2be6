/*
 * Rootbank's alerts in the service worker: shows each pushed alert as a notification, and a tap opens the
 * page it is about (a field, the plan, the log) in a Rootbank window, reusing one when there is one.
 * Imported by sw.js with importScripts, so it shares the worker's global scope.
 */

/**
 * The same-origin URL a tap on an alert opens. Anything else in a payload (another host, a script URL)
 * falls back to the farm list, so a crafted payload cannot send the phone elsewhere.
 */
function rootbankAlertTarget(data, origin) {
  const fallback = new URL("/farms", origin).href;
  if (!data || typeof data.url !== "string" || !data.url.startsWith("/") || data.url.startsWith("//")) return fallback;
  try {
    const url = new URL(data.url, origin);
    return url.origin === origin ? url.href : fallback;
  } catch {
    return fallback;
  }
}

/** What a push payload becomes on screen; a payload that is not our JSON still says something. */
function rootbankNotificationOf(text) {
  let data;
  try {
    data = JSON.parse(text);
  } catch {
    data = null;
  }
  if (!data || typeof data.title !== "string") return { title: "Rootbank", options: { body: text || "Something on your farm needs a look.", data: {} } };
  return {
    title: data.title,
    options: {
      body: typeof data.body === "string" ? data.body : "",
      tag: typeof data.tag === "string" ? data.tag : undefined,
      icon: "/icons/icon-192.png",
      badge: "/icons/icon-192.png",
      data: { url: data.url, notificationId: data.notificationId, farmId: data.farmId },
    },
  };
}

self.addEventListener("push", (event) => {
  const text = event.data ? event.data.text() : "";
  const { title, options } = rootbankNotificationOf(text);
  event.waitUntil(self.registration.showNotification(title, options));
});

self.addEventListener("notificationclick", (event) => {
  event.notification.close();
  const target = rootbankAlertTarget(event.notification.data, self.location.origin);
  event.waitUntil(
    self.clients.matchAll({ type: "window", includeUncontrolled: true }).then((windows) => {
      const open = windows.find((w) => new URL(w.url).origin === self.location.origin && "navigate" in w);
      // navigate() is refused for a window this worker does not control; a new window then.
      if (open) return open.navigate(target).then((w) => (w || open).focus()).catch(() => self.clients.openWindow(target));
      return self.clients.openWindow(target);
    }),
  );
});
