/*
 * Rootbank's service worker. It keeps the app shell (scripts, styles, fonts, icons) and the pages a
 * worker logs from, so the log opens with no signal. It never stores API answers: those carry one
 * person's farm data, and the log keeps its own queue in IndexedDB instead. Cached pages are dropped
 * when anyone signs in or out, so the next person on a shared phone never sees the last one's page.
 */
importScripts("/sw-alerts.js");
const VERSION = "v1";
const SHELL = `rootbank-shell-${VERSION}`;
const PAGES = `rootbank-pages-${VERSION}`;
// Registered with ?mode=dev under `next dev`, whose chunks are not content-hashed: there assets go network first.
const DEV = new URL(self.location.href).searchParams.get("mode") === "dev";
const PRECACHE = ["/manifest.webmanifest", "/icons/rootbank.svg", "/icons/icon-192.png", "/icons/icon-512.png"];

// Pages kept for offline use: a farm's log and its front page (where the worker lands after sign-in).
const OFFLINE_PAGE = /^\/farms\/[0-9a-f-]{36}(\/log)?\/?$/;

self.addEventListener("install", (event) => {
  event.waitUntil(
    caches
      .open(SHELL)
      .then((cache) => cache.addAll(PRECACHE))
      .then(() => self.skipWaiting()),
  );
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((keys) => Promise.all(keys.filter((k) => k.startsWith("rootbank-") && k !== SHELL && k !== PAGES).map((k) => caches.delete(k))))
      .then(() => self.clients.claim()),
  );
});

function offlineAnswer() {
  const html =
    '<!doctype html><html lang="en"><meta name="viewport" content="width=device-width,initial-scale=1"><title>Offline · Rootbank</title>' +
    '<body style="font-family:system-ui,sans-serif;background:#f6f3ec;color:#17261f;padding:1.5rem;max-width:32rem;margin:auto">' +
    "<h1>No connection</h1><p>This page has not been opened on this phone while online, so there is no copy of it here.</p>" +
    "<p>Open the farm's <strong>Log</strong> page once with a connection and it will open offline from then on.</p></body></html>";
  return new Response(html, { status: 503, headers: { "Content-Type": "text/html; charset=utf-8" } });
}

/** Network first for pages, so a worker online always gets today's page; the copy is for no signal. */
async function page(request) {
  const url = new URL(request.url);
  try {
    const res = await fetch(request);
    if (res.ok && !res.redirected && OFFLINE_PAGE.test(url.pathname)) {
      const copy = res.clone();
      caches.open(PAGES).then((cache) => cache.put(url.pathname, copy));
    }
    return res;
  } catch {
    const cached = await caches.match(url.pathname, { cacheName: PAGES });
    return cached || offlineAnswer();
  }
}

/** Build output under /_next/static is content-hashed, so a stored copy never goes stale. */
async function asset(request) {
  if (DEV) {
    try {
      const res = await fetch(request);
      if (res.ok) {
        const copy = res.clone();
        caches.open(SHELL).then((cache) => cache.put(request, copy));
      }
      return res;
    } catch {
      return (await caches.match(request, { cacheName: SHELL })) || Response.error();
    }
  }
  const cached = await caches.match(request, { cacheName: SHELL });
  if (cached) return cached;
  const res = await fetch(request);
  if (res.ok) {
    const copy = res.clone();
    caches.open(SHELL).then((cache) => cache.put(request, copy));
  }
  return res;
}

self.addEventListener("fetch", (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;

  if (url.pathname.startsWith("/api/auth/signout") || url.pathname.startsWith("/api/auth/callback")) {
    event.waitUntil(caches.delete(PAGES));
    return;
  }
  if (request.method !== "GET" || url.pathname.startsWith("/api/")) return;

  if (request.mode === "navigate") {
    event.respondWith(page(request));
    return;
  }
  if (url.pathname.startsWith("/_next/static/") || url.pathname.startsWith("/icons/") || url.pathname === "/manifest.webmanifest") {
    event.respondWith(asset(request));
  }
});

/*
 * The page that registered this worker loaded its scripts before the worker could see them: it sends
 * their addresses (and its own, when it is a page kept for offline use) so they are stored now.
 */
self.addEventListener("message", (event) => {
  const data = event.data || {};
  if (data.type !== "keep") return;
  const assets = (data.assets || []).filter((u) => new URL(u, self.location.origin).pathname.startsWith("/_next/static/"));
  const jobs = [caches.open(SHELL).then((cache) => Promise.all(assets.map((u) => cache.add(u).catch(() => undefined))))];
  if (typeof data.page === "string" && OFFLINE_PAGE.test(data.page)) {
    jobs.push(
      fetch(data.page, { credentials: "same-origin" }).then((res) => {
        if (res.ok && !res.redirected) return caches.open(PAGES).then((cache) => cache.put(data.page, res));
      }),
    );
  }
  event.waitUntil(Promise.all(jobs).catch(() => undefined));
});
