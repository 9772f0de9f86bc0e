/**
 * Two phones against a real sync server on loopback: each phone is the app's own IndexedDB record
 * store (fake-indexeddb in Node) with the sync client on top. "Offline" is the network failing:
 * the phone's fetch throws and its online flag is false, as a browser reports it.
 */
import 'fake-indexeddb/auto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Corrections, Plate, RecordKind } from '../../schema/records.ts';
import type { PullResponse } from '../../schema/sync-protocol.ts';
import { openIdbStore } from '../../web/storage/idb-store.ts';
import type { RecordStore } from '../../web/storage/record-store.ts';
import { openSyncState } from '../../web/sync/sync-state.ts';
import { call, ENGINE, startTestServer, type TestServer } from './harness.ts';
import {
  analysis,
  assay,
  at,
  colony,
  corrections,
  experiment,
  plate,
  revised,
  sample,
} from './marrowfield.ts';
import { makePhone } from './phone.ts';

let server: TestServer;
let phoneCount = 0;
const phone = (name = `phone-${++phoneCount}`, network = { up: true }) => makePhone(name, network);
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

async function serverHeads(token: string): Promise<Map<string, unknown[]>> {
  const out = new Map<string, unknown[]>();
  let cursor = '0';
  for (;;) {
    const { json } = await call<PullResponse>(`${server.sync}/changes?since=${cursor}`, token);
    for (const r of json.records)
      out.set(
        `${r.kind}/${r.id}`,
        r.heads.map((h) => h.body),
      );
    cursor = json.cursor;
    if (!json.more) return out;
  }
}

async function everything(records: RecordStore): Promise<Map<string, unknown>> {
  const out = new Map<string, unknown>();
  for (const kind of ['experiments', 'assays', 'samples', 'plates', 'corrections'] as RecordKind[])
    for (const r of await records.all(kind)) out.set(`${kind}/${r.id}`, r);
  return out;
}

describe('two phones on one experiment', () => {
  it('both work offline on the same plate; both end with the same data and the conflict shown', async () => {
    const token = await server.lab('two-phones-client');
    const settings = { serverUrl: server.origin, token };
    const a = await phone();
    const b = await phone();
    expect(a.client.status().phase).toBe('off');
    expect(await a.client.connect(settings)).toBeNull();
    expect(await b.client.connect(settings)).toBeNull();

    // Phone A sets up the experiment at the bench; phone B picks it up.
    await a.records.put('experiments', experiment());
    await a.records.put('assays', assay('mf-L1-r1'));
    await a.records.put('samples', sample('mf-L1-r1-start', 'mf-L1-r1'));
    await a.records.put('plates', plate('mf-plate-1'));
    await a.records.put(
      'corrections',
      corrections('mf-corr-1', [{ op: 'remove', colonyId: 'c3' }]),
    );
    expect(a.client.status().waiting).toBe(5);
    expect((await a.client.syncNow()).waiting).toBe(0);
    await b.client.syncNow();
    expect(await b.records.get('plates', 'mf-plate-1')).toEqual(plate('mf-plate-1'));

    // Both go out of the network and edit the same plate and the same corrections.
    a.network.up = false;
    b.network.up = false;
    const p = (await a.records.get('plates', 'mf-plate-1')) as Plate;
    await a.records.put('plates', revised(p, { typedCounts: { test: 120, reference: 97 } }, 20));
    await b.records.put('plates', revised(p, { reviewed: true }, 21));
    const c = (await a.records.get('corrections', 'mf-corr-1')) as Corrections;
    const tapA = { op: 'add' as const, colony: { ...colony(200, 1), lab: null, deltaLab: null } };
    const tapB = { op: 'reclass' as const, colonyId: 'c8', cls: 0 as const };
    await a.records.put('corrections', revised(c, { edits: [...c.edits, tapA] }, 22));
    await b.records.put('corrections', revised(c, { edits: [...c.edits, tapB] }, 23));
    const offline = await a.client.syncNow();
    expect(offline.phase).toBe('offline');
    expect(offline.waiting).toBe(2);

    // Back in the network: A first, then B, then A again to hear of B's edits.
    a.network.up = true;
    b.network.up = true;
    await a.client.syncNow();
    const onB = await b.client.syncNow();
    const onA = await a.client.syncNow();
    for (const status of [onA, onB]) {
      expect(status.conflicts.map((x) => `${x.kind}/${x.id}:${x.heads}`).sort()).toEqual([
        'corrections/mf-corr-1:2',
        'plates/mf-plate-1:2',
      ]);
      expect(status.waiting).toBe(0);
    }
    // Neither edit was lost: both are on the server as heads of the plate.
    const heads = (await serverHeads(token)).get('plates/mf-plate-1') as Plate[];
    expect(heads.map((h) => [h.typedCounts?.test, h.reviewed]).sort()).toEqual([
      [112, true],
      [120, false],
    ]);

    // B resolves: the plate by taking A's counts with B's review, the taps by merging both sets.
    const conflict = (await b.client.conflict('plates', 'mf-plate-1'))!;
    expect(conflict.heads).toHaveLength(2);
    await b.client.resolve('plates', 'mf-plate-1', {
      ...p,
      typedCounts: { test: 120, reference: 97 },
      reviewed: true,
    });
    const merged = await b.client.mergeCorrections('mf-corr-1');
    expect(merged).toMatchObject({ ok: true, disagreements: [] });
    await b.client.syncNow();
    const settledA = await a.client.syncNow();
    expect(settledA.conflicts).toEqual([]);
    expect((await b.client.syncNow()).conflicts).toEqual([]);

    const onServer = await serverHeads(token);
    const dataA = await everything(a.records);
    const dataB = await everything(b.records);
    expect(dataA).toEqual(dataB);
    expect([...onServer.keys()].sort()).toEqual([...dataA.keys()].sort());
    for (const [key, bodies] of onServer) expect(bodies).toEqual([dataA.get(key)]);
    const finalPlate = dataA.get('plates/mf-plate-1') as Plate;
    expect([finalPlate.typedCounts?.test, finalPlate.reviewed]).toEqual([120, true]);
    const finalTaps = (dataA.get('corrections/mf-corr-1') as Corrections).edits;
    expect(finalTaps).toEqual([tapA, { op: 'remove', colonyId: 'c3' }, tapB]);
  });
});

describe('a deletion against an edit', () => {
  it('keeps the edit as a head beside the tombstone, and a deletion chosen on one phone reaches both', async () => {
    const token = await server.lab('delete-vs-edit');
    const settings = { serverUrl: server.origin, token };
    const a = await phone();
    const b = await phone();
    await a.client.connect(settings);
    await b.client.connect(settings);
    const base = plate('mf-plate-d');
    await a.records.put('plates', base);
    await a.client.syncNow();
    await b.client.syncNow();

    a.network.up = false;
    b.network.up = false;
    await a.records.remove({ plates: ['mf-plate-d'] });
    await b.records.put('plates', revised(base, { reviewed: true }, 40));
    a.network.up = true;
    b.network.up = true;
    await a.client.syncNow();
    await b.client.syncNow();
    const seenOnA = await a.client.syncNow();
    expect(seenOnA.conflicts).toEqual([{ kind: 'plates', id: 'mf-plate-d', heads: 2 }]);
    const heads = (await a.client.conflict('plates', 'mf-plate-d'))!.heads;
    expect(heads.map((h) => h.deleted).sort()).toEqual([false, true]);
    // The reviewed edit is not lost while the conflict stands: B still shows it.
    expect((await b.records.get('plates', 'mf-plate-d'))?.reviewed).toBe(true);

    await a.client.resolve('plates', 'mf-plate-d', null);
    await a.client.syncNow();
    const onB = await b.client.syncNow();
    expect(onB.conflicts).toEqual([]);
    expect(await b.records.get('plates', 'mf-plate-d')).toBeUndefined();
    expect(await a.records.get('plates', 'mf-plate-d')).toBeUndefined();
    expect((await serverHeads(token)).get('plates/mf-plate-d')).toEqual([null]);
  });
});

describe('one phone', () => {
  it('keeps queued changes across a reload and sends them when the network returns', async () => {
    const token = await server.lab('reload');
    const network = { up: true };
    const first = await phone('reloading', network);
    await first.client.connect({ serverUrl: server.origin, token });
    network.up = false;
    await first.records.put('plates', plate('mf-plate-r1'));
    await first.records.put('plates', plate('mf-plate-r2'));
    await first.records.remove({ plates: ['mf-plate-r2'] });
    expect(first.client.status().waiting).toBe(2);
    first.client.stop();

    // The tab is closed and opened again, still without a network, then the network returns.
    const again = await phone('reloading', network);
    expect(again.client.status().waiting).toBe(2);
    network.up = true;
    const status = await again.client.syncNow();
    expect(status).toMatchObject({ phase: 'idle', waiting: 0, problem: null });
    const onServer = await serverHeads(token);
    expect(onServer.get('plates/mf-plate-r1')).toEqual([plate('mf-plate-r1')]);
    expect(onServer.get('plates/mf-plate-r2')).toEqual([null]);
    again.client.stop();
  });

  it('finds a change whose queueing was cut short, and sets aside one the server refuses', async () => {
    const token = await server.lab('rescan');
    const name = 'rescanning';
    const first = await phone(name);
    await first.client.connect({ serverUrl: server.origin, token });
    await first.client.syncNow();
    first.client.stop();
    // Written to the app's store without reaching the outbox, as when the tab dies in between.
    const bare = await openIdbStore(`${name}-records`);
    await bare.put('plates', plate('mf-plate-lost'));
    // A change from an older app version that the server no longer takes.
    const state = await openSyncState(`${name}-sync`);
    await state.queue({
      kind: 'plates',
      id: 'mf-plate-old',
      revision: 1,
      updatedAt: at(9),
      deleted: false,
      body: { ...plate('mf-plate-old'), volumeUl: 0 },
      queuedAt: at(9),
    });

    const again = await phone(name);
    const status = await again.client.syncNow();
    expect((await serverHeads(token)).get('plates/mf-plate-lost')).toEqual([
      plate('mf-plate-lost'),
    ]);
    expect(status.waiting).toBe(1);
    expect(status.problem?.message).toBe(
      'The lab server refused 1 change(s): body.changes[0] (plates mf-plate-old).body.volumeUl: must be greater than 0, got 0',
    );
    again.client.stop();
  });

  it('asked to merge taps where there is no conflict, says so', async () => {
    const p = await phone();
    await p.records.put('corrections', corrections('mf-corr-9'));
    expect(await p.client.mergeCorrections('mf-corr-9')).toMatchObject({
      ok: false,
      problem: 'no-conflict',
      message: 'corrections mf-corr-9 have no conflict to merge',
    });
  });

  it('works with sync off, keeping what it changed for when sync is turned on', async () => {
    const token = await server.lab('off-and-on');
    const p = await phone();
    await p.records.put('plates', plate('mf-plate-before'));
    expect(p.client.status()).toMatchObject({ phase: 'off', waiting: 1 });
    await p.client.connect({ serverUrl: server.origin, token });
    expect((await p.client.syncNow()).waiting).toBe(0);
    await p.client.disconnect();
    await p.records.put('plates', plate('mf-plate-while-off'));
    expect(p.client.status()).toMatchObject({ phase: 'off', waiting: 1 });
    expect((await serverHeads(token)).has('plates/mf-plate-while-off')).toBe(false);
    await p.client.connect({ serverUrl: server.origin, token });
    await p.client.syncNow();
    expect([...(await serverHeads(token)).keys()].sort()).toEqual([
      'plates/mf-plate-before',
      'plates/mf-plate-while-off',
    ]);
    p.client.stop();
  });

  it('says clearly when the token is wrong or the server is not there', async () => {
    const p = await phone();
    expect(await p.client.connect({ serverUrl: server.origin, token: 'rpt_wrong' })).toEqual({
      code: 'bad-token',
      message:
        'The server does not accept this token. Ask whoever runs the lab server for a new token and enter it in the sync settings. Your changes stay on this phone.',
    });
    const nowhere = await p.client.connect({ serverUrl: 'http://127.0.0.1:9', token: 'rpt_x' });
    expect(nowhere?.code).toBe('unreachable');
    expect(p.client.status().phase).toBe('off');
  });

  // The SQLite file's cap (--max-db-mb), which PostgreSQL has no counterpart of.
  it.skipIf(ENGINE === 'postgres')(
    'keeps changes on the phone and says so while the server is full',
    async () => {
      const small = await startTestServer({ maxBytes: 256 * 1024 });
      try {
        const token = await small.lab('full-client');
        const p = await phone();
        expect(await p.client.connect({ serverUrl: small.origin, token })).toBeNull();
        const dense = Array.from({ length: 40 }, (_, i) =>
          analysis(`full-an-${i}`, `mf-plate-${i}`, 150),
        );
        await p.records.putBatch({ analyses: dense });
        const full = await p.client.syncNow();
        expect(full).toMatchObject({
          phase: 'retrying',
          waiting: 40,
          problem: {
            code: 'storage-full',
            message:
              'The lab server is out of space. Your changes stay on this phone and are sent once space is freed.',
          },
        });
        expect(await small.rows('SELECT count(*) AS n FROM revisions')).toEqual([{ n: 0 }]);
        p.client.stop();
      } finally {
        await small.close();
      }
    },
  );
});
