import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { at, plate } from '../../tests/sync/marrowfield.ts';
import { type OutboxEntry, openSyncState } from './sync-state.ts';

let n = 0;
const fresh = () => `sync-state-test-${++n}`;
const entry = (id: string, revision: number, minutes: number): OutboxEntry => ({
  kind: 'plates',
  id,
  revision,
  updatedAt: at(minutes),
  deleted: false,
  body: { ...plate(id), revision, updatedAt: at(minutes) },
  queuedAt: at(minutes),
});
const H = (c: string) => c.repeat(64);

describe('sync state in IndexedDB', () => {
  it('keeps one waiting change per record, oldest first, with what it replaces', async () => {
    const s = await openSyncState(fresh());
    await s.queue(entry('p1', 1, 1));
    await s.queue(entry('p2', 1, 2));
    await s.queue(entry('p1', 2, 3));
    await s.setKnown({ kind: 'plates', id: 'p2', hashes: [H('a')], revision: 1, deleted: false });
    expect(await s.waiting()).toBe(2);
    const pending = await s.pending(10);
    expect(pending.map((c) => [c.id, c.revision, c.replaces])).toEqual([
      ['p2', 1, [H('a')]],
      ['p1', 2, []],
    ]);
    expect(await s.pending(1)).toHaveLength(1);
  });

  it('survives closing and opening again, device id included', async () => {
    const name = fresh();
    const s = await openSyncState(name);
    await s.queue(entry('p1', 1, 1));
    const device = await s.meta('device');
    await s.setMeta('cursor', '42');
    s.close();
    const again = await openSyncState(name);
    expect(await again.waiting()).toBe(1);
    expect(await again.meta('device')).toBe(device);
    expect(await again.meta('cursor')).toBe('42');
  });

  it('settles only what the server took: a record edited during the push stays queued', async () => {
    const s = await openSyncState(fresh());
    await s.queue(entry('p1', 1, 1));
    await s.queue(entry('p2', 1, 1));
    const sent = await s.pending(10);
    await s.queue(entry('p2', 2, 5)); // tapped again while the push was on its way
    await s.settle(
      [
        { kind: 'plates', id: 'p1', revision: 1, hash: H('1'), repeat: false },
        { kind: 'plates', id: 'p2', revision: 1, hash: H('2'), repeat: false },
      ],
      sent,
    );
    expect((await s.pending(10)).map((c) => [c.id, c.revision, c.replaces])).toEqual([
      ['p2', 2, [H('2')]],
    ]);
    expect(await s.known('plates', 'p1')).toEqual({
      kind: 'plates',
      id: 'p1',
      hashes: [H('1')],
      revision: 1,
      deleted: false,
    });
  });

  it('sets a refused change aside until the record is edited again', async () => {
    const s = await openSyncState(fresh());
    await s.queue(entry('p1', 1, 1));
    await s.queue(entry('p2', 1, 2));
    await s.refuse('plates', 'p1', 1, 'volumeUl: must be greater than 0');
    expect((await s.pending(10)).map((c) => c.id)).toEqual(['p2']);
    expect((await s.refused()).map((e) => e.refusal)).toEqual(['volumeUl: must be greater than 0']);
    expect(await s.waiting()).toBe(2);
    await s.queue(entry('p1', 2, 3));
    expect((await s.pending(10)).map((c) => c.id)).toEqual(['p2', 'p1']);
  });
});
