/**
 * One phone's sync, set up the way the app sets it up, for the browser test: bundled and loaded
 * in Chromium, which gives it real IndexedDB, real fetch and the real online and offline events.
 */

import { openIdbStore } from '../../../web/storage/idb-store.ts';
import type { RecordStore } from '../../../web/storage/record-store.ts';
import { browserEnv, requestBackgroundSync } from '../../../web/sync/browser-env.ts';
import { DEFAULT_POLICY } from '../../../web/sync/scheduler.ts';
import { createSyncClient, type SyncClient } from '../../../web/sync/sync-client.ts';
import { openSyncState } from '../../../web/sync/sync-state.ts';

export interface BrowserPhone {
  client: SyncClient;
  records: RecordStore;
}

async function startPhone(): Promise<BrowserPhone> {
  const client = await createSyncClient({
    records: await openIdbStore(),
    state: await openSyncState(),
    env: browserEnv(),
    // A short wait after a tap keeps the test quick; the rest is the app's own policy.
    policy: { ...DEFAULT_POLICY, afterChangeMs: 200 },
  });
  return { client, records: client.records };
}

Object.assign(window, { startPhone, requestBackgroundSync });
