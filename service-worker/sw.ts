/// <reference lib="webworker" />
/**
 * Vineward's service worker. Precaches the app shell (the build's static files, the offline page,
 * icons), keeps the pages and layout data a scout has opened so they load with no signal, and
 * wakes open pages to drain the outbox when Background Sync fires. The outbox itself lives in the
 * page (IndexedDB); this worker never holds or drops a record.
 */
import { clientsClaim } from 'workbox-core';
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute } from 'workbox-precaching';
import { registerRoute, setCatchHandler } from 'workbox-routing';
import { CacheFirst, NetworkFirst } from 'workbox-strategies';
import { ExpirationPlugin } from 'workbox-expiration';
import { CACHES, SYNC_TAG } from '../lib/device-keys';

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: { url: string; revision: string | null }[] };

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();
// The first worker takes over the open page at once, so it works offline without a reload. Later
// versions wait for the person to accept the update (see components/layout/service-worker.tsx).
clientsClaim();

const OFFLINE_PAGE = '/offline';

// Pages: fresh when online, the last copy when not. The query (row, position) does not change the
// page itself, so any copy of the path serves.
registerRoute(
  ({ request, url }) => request.mode === 'navigate' && url.origin === self.location.origin && !url.pathname.startsWith('/api/'),
  new NetworkFirst({
    cacheName: CACHES.pages,
    networkTimeoutSeconds: 5,
    matchOptions: { ignoreSearch: true },
    plugins: [new ExpirationPlugin({ maxEntries: 60 })],
  }),
);

// Layout data a scout has opened: blocks, rows, slots, recent sprays, plans.
registerRoute(
  ({ request, url }) =>
    request.method === 'GET' &&
    url.origin === self.location.origin &&
    (url.pathname.startsWith('/api/field/') || url.pathname === '/api/blocks' || url.pathname === '/api/me'),
  new NetworkFirst({ cacheName: CACHES.layout, networkTimeoutSeconds: 5, plugins: [new ExpirationPlugin({ maxEntries: 400 })] }),
);

registerRoute(({ url }) => url.origin === self.location.origin && url.pathname.startsWith('/icons/'), new CacheFirst({ cacheName: CACHES.icons }));

setCatchHandler(async ({ request }) => {
  if (request.mode === 'navigate') return (await matchPrecache(OFFLINE_PAGE)) ?? Response.error();
  return Response.error();
});

self.addEventListener('message', (event) => {
  if (event.data?.type === 'SKIP_WAITING') void self.skipWaiting();
});

// Background Sync only wakes the pages; the drain runs there, with the page's session.
self.addEventListener('sync', (event) => {
  const e = event as ExtendableEvent & { tag: string };
  if (e.tag !== SYNC_TAG) return;
  e.waitUntil(
    self.clients.matchAll({ type: 'window' }).then((clients) => {
      for (const client of clients) client.postMessage(SYNC_TAG);
    }),
  );
});
