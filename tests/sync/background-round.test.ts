/**
 * The service worker's background round, run here in Node against the real sync server on
 * loopback, on the same IndexedDB stores (fake-indexeddb) a phone's app left behind.
 */
import 'fake-indexeddb/auto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PullResponse } from '../../schema/sync-protocol.ts';
import { openIdbStore } from '../../web/storage/idb-store.ts';
import { backgroundRound } from '../../web/sync/background-round.ts';
import { openSyncState } from '../../web/sync/sync-state.ts';
import { call, startTestServer, type TestServer } from './harness.ts';
import { assay, experiment } from './marrowfield.ts';
import { makePhone } from './phone.ts';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

const onServer = async (token: string) =>
  (await call<PullResponse>(`${server.sync}/changes?since=0`, token)).json.records.map(
    (r) => `${r.kind}/${r.id}`,
  );
const down: typeof fetch = () => Promise.reject(new TypeError('network is down'));

/** A phone that turned sync on, then made changes offline and was closed before the network returned. */
async function closedOfflinePhone(name: string, token: string) {
  const network = { up: true };
  const phone = await makePhone(name, network);
  expect(await phone.client.connect({ serverUrl: server.origin, token })).toBeNull();
  network.up = false;
  await phone.records.put('experiments', experiment(`${name}-exp`));
  await phone.records.put('assays', { ...assay(`${name}-assay`), experimentId: `${name}-exp` });
  phone.client.stop();
  return {
    records: await openIdbStore(`${name}-records`),
    state: await openSyncState(`${name}-sync`),
  };
}

describe('background round', () => {
  it('sends what waited in the outbox and brings in what others sent', async () => {
    const token = await server.lab('Marrowfield pond');
    const other = await makePhone('bg-other');
    await other.client.connect({ serverUrl: server.origin, token });
    await other.records.put('experiments', experiment('bg-from-other'));
    await other.client.syncNow();

    const closed = await closedOfflinePhone('bg-a', token);
    expect(await closed.state.waiting()).toBe(2);
    expect(await backgroundRound(closed.records, closed.state)).toBe('done');
    expect(await closed.state.waiting()).toBe(0);
    expect((await onServer(token)).sort()).toEqual([
      'assays/bg-a-assay',
      'experiments/bg-a-exp',
      'experiments/bg-from-other',
    ]);
    expect((await closed.records.get('experiments', 'bg-from-other'))?.id).toBe('bg-from-other');
  });

  it('rejects while the network is still down, so the browser fires it again later; nothing is lost', async () => {
    const token = await server.lab('Marrowfield pond');
    const closed = await closedOfflinePhone('bg-b', token);
    await expect(backgroundRound(closed.records, closed.state, down)).rejects.toThrow(
      /cannot reach/,
    );
    expect(await closed.state.waiting()).toBe(2);
    expect(await backgroundRound(closed.records, closed.state)).toBe('done');
    expect(await onServer(token)).toContain('experiments/bg-b-exp');
  });

  it('does nothing when sync is off, and settles (no retry) when the token is refused', async () => {
    const records = await openIdbStore('bg-off-records');
    const state = await openSyncState('bg-off-sync');
    expect(await backgroundRound(records, state, down)).toBe('off');

    const token = await server.lab('Marrowfield pond');
    const closed = await closedOfflinePhone('bg-c', token);
    await closed.state.setMeta('settings', { serverUrl: server.origin, token: 'rpt_revoked' });
    expect(await backgroundRound(closed.records, closed.state)).toBe('refused');
    expect(await closed.state.waiting()).toBe(2);
  });
});
