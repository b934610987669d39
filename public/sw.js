/* global self, caches, fetch, URL */
/*
 * Coilyard's service worker: the session form opens with no connection (issue 14, bench logging).
 *
 * Hand-written rather than built with a Next.js service-worker library: those generate the worker from the
 * build's asset manifest through a bundler plugin, which needs webpack (Next 16 builds with Turbopack here)
 * or an extra build step and a new npm dependency, which the team does not add. What is needed is small:
 *
 * - Navigations to the session form (/sessions/new?coil=…): network first; a good answer (200, not redirected,
 *   so never the sign-in page a signed-out visit is sent to) is copied into the cache; with no network the copy
 *   is served. The copy keeps its own Content-Security-Policy header, whose nonce matches its inline scripts.
 * - Next's build assets (/_next/static/…, content-hashed and immutable): cache first.
 * - Nothing else is touched: API answers, other pages and other people's data are never cached. Submissions
 *   made offline are kept by the page in IndexedDB (app/(app)/sessions/new/offline-queue.ts), not here.
 */
const FORM_CACHE = "coilyard-session-form-v1";
const ASSET_CACHE = "coilyard-static-v1";
const FORM_PATH = "/sessions/new";

self.addEventListener("install", () => self.skipWaiting());

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) => Promise.all(names.filter((n) => n.startsWith("coilyard-") && n !== FORM_CACHE && n !== ASSET_CACHE).map((n) => caches.delete(n))))
      .then(() => self.clients.claim()),
  );
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET") return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  if (request.mode === "navigate" && url.pathname === FORM_PATH) {
    event.respondWith(formNetworkFirst(request));
  } else if (url.pathname.startsWith("/_next/static/")) {
    event.respondWith(assetCacheFirst(request));
  }
});

async function formNetworkFirst(request) {
  const cache = await caches.open(FORM_CACHE);
  try {
    const response = await fetch(request);
    if (response.ok && !response.redirected) {
      await cache.put(request, response.clone());
    } else if (response.redirected) {
      // Signed out (sent to sign-in): forget the signed-in copy rather than show it to whoever holds the device.
      await cache.delete(request);
    }
    return response;
  } catch (error) {
    // Only this coil's own copy: another coil's form would log the readings against that coil.
    const copy = await cache.match(request);
    if (copy) return copy;
    throw error;
  }
}

async function assetCacheFirst(request) {
  const cache = await caches.open(ASSET_CACHE);
  const copy = await cache.match(request);
  if (copy) return copy;
  const response = await fetch(request);
  if (response.ok) await cache.put(request, response.clone());
  return response;
}
