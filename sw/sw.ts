/// <reference lib="webworker" />
/**
 * Tufa's service worker: precaches the app shell (the list is injected at build time), answers
 * every navigation with the cached index.html so the app starts with no network, and activates a
 * new version only when the page asks (the user pressed "Reload to update").
 *
 * Readings never pass through here: they live in IndexedDB, and sync reads its own outbox there.
 * Background Sync (Chromium) only wakes this worker when the network is back; it then asks the
 * open pages to sync from their outbox (`src/sync/sync-triggers.ts`).
 */

import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { listenForBackgroundSync } from '../src/sync/sync-triggers';

declare const self: ServiceWorkerGlobalScope & {
  __WB_MANIFEST: (string | { url: string; revision: string | null })[];
};

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();
registerRoute(new NavigationRoute(createHandlerBoundToURL('index.html')));

self.addEventListener('message', (event) => {
  if ((event.data as { type?: string } | null)?.type === 'SKIP_WAITING') void self.skipWaiting();
});

listenForBackgroundSync(self);
