/**
 * A phone for the sync tests: the app's own IndexedDB record store (fake-indexeddb in Node) with
 * the sync client on top. "Offline" is the network failing: the phone's fetch throws and its
 * online flag is false, as a browser reports it.
 */
import 'fake-indexeddb/auto';
import { openIdbStore } from '../../web/storage/idb-store.ts';
import type { RecordStore } from '../../web/storage/record-store.ts';
import type { SchedulerEnv } from '../../web/sync/scheduler.ts';
import { createSyncClient, type SyncClient } from '../../web/sync/sync-client.ts';
import { openSyncState } from '../../web/sync/sync-state.ts';

export interface Phone {
  client: SyncClient;
  records: RecordStore;
  network: { up: boolean };
}

/** A phone: its own databases (named so a "reload" can open them again), its own network. */
export async function makePhone(name: string, network = { up: true }): Promise<Phone> {
  const env: SchedulerEnv = {
    // Rounds run when the test asks (syncNow); the timers of a real phone would only add more.
    setTimer: () => () => {},
    isOnline: () => network.up,
    onOnline: () => () => {},
    random: () => 0.5,
  };
  const netFetch: typeof fetch = (input, init) =>
    network.up ? fetch(input, init) : Promise.reject(new TypeError('network is down'));
  const records = await openIdbStore(`${name}-records`);
  const client = await createSyncClient({
    records,
    state: await openSyncState(`${name}-sync`),
    env,
    fetch: netFetch,
  });
  return { client, records: client.records, network };
}
