/**
 * The app's service worker: precaches the built app (the list is injected at build time) so it
 * opens and works with no network, waits with a new version until the person accepts it, and
 * runs a sync round on Background Sync's `sync` event.
 */
import { clientsClaim } from 'workbox-core';
import {
  cleanupOutdatedCaches,
  createHandlerBoundToURL,
  type PrecacheEntry,
  precacheAndRoute,
} from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { openIdbStore } from '../storage/idb-store.ts';
import type { RecordStore } from '../storage/record-store.ts';
import {
  BACKGROUND_SYNC_TAG,
  BACKGROUND_SYNCED,
  backgroundRound,
} from '../sync/background-round.ts';
import { openSyncState, type SyncState } from '../sync/sync-state.ts';

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: (string | PrecacheEntry)[] };

/** Background Sync's event; TypeScript's worker types do not have it. */
interface SyncEvent extends ExtendableEvent {
  readonly tag: string;
}

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();
// Every address inside the app opens the app; its own router takes it from there.
registerRoute(new NavigationRoute(createHandlerBoundToURL('index.html')));
clientsClaim();

// workbox-window's messageSkipWaiting(), sent when the person accepts the new version.
self.addEventListener('message', (event) => {
  if ((event.data as { type?: unknown } | null)?.type === 'SKIP_WAITING') void self.skipWaiting();
});

// Opened on the first sync event and kept for the worker's life: one connection each, not one
// per event.
let stores: Promise<[RecordStore, SyncState]> | undefined;

async function syncInBackground(): Promise<void> {
  stores ??= Promise.all([openIdbStore(), openSyncState()]);
  const [records, state] = await stores.catch((e: unknown) => {
    stores = undefined; // tried afresh next time
    throw e;
  });
  const outcome = await backgroundRound(records, state);
  if (outcome === 'off') return;
  for (const client of await self.clients.matchAll({ type: 'window' }))
    client.postMessage({ type: BACKGROUND_SYNCED });
}

self.addEventListener('sync' as keyof ServiceWorkerGlobalScopeEventMap, (event) => {
  const sync = event as unknown as SyncEvent;
  if (sync.tag === BACKGROUND_SYNC_TAG) sync.waitUntil(syncInBackground());
});
