"use client";

import { useEffect } from "react";

/**
 * Registers public/sw.js, then hands it the scripts this page already loaded and the page's own address,
 * so the log opens offline even right after the first visit.
 */
export function ServiceWorker() {
  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    const dev = process.env.NODE_ENV !== "production";
    navigator.serviceWorker
      .register(dev ? "/sw.js?mode=dev" : "/sw.js", { scope: "/" })
      .then(() => navigator.serviceWorker.ready)
      .then((reg) => {
        const assets = performance
          .getEntriesByType("resource")
          .map((e) => e.name)
          .filter((u) => u.startsWith(`${location.origin}/_next/static/`));
        reg.active?.postMessage({ type: "keep", assets, page: location.pathname });
      })
      .catch(() => undefined);
  }, []);
  return null;
}
