import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import type { Assay, Experiment, Photo } from '../../schema/records.ts';
import { openIdbStore } from './idb-store.ts';
import { newStamp, revised } from './stamp.ts';

function experiment(): Experiment {
  return {
    ...newStamp(),
    name: 'Test experiment',
    demo: false,
    lines: ['L1'],
    referenceName: 'ancestor',
    transferDilution: 100,
    defaultDilutionFold: 1e5,
    defaultVolumeUl: 100,
    markerColours: [
      { name: 'red', hex: '#b3362c' },
      { name: 'white', hex: '#efe3d3' },
    ],
    palette: null,
    learning: { enabled: true, model: null, since: null },
  };
}

function assay(experimentId: string, line: string): Assay {
  return {
    ...newStamp(),
    experimentId,
    line,
    generation: 500,
    replicate: 1,
    group: line,
    testClass: 1,
    foldDilutionSinceStart: 100,
    days: 1,
    block: null,
  };
}

let dbCount = 0;
const freshStore = () => openIdbStore(`test-${++dbCount}`);

describe('IndexedDB record store', () => {
  it('reads back what it wrote, by id, by parent and in full', async () => {
    const store = await freshStore();
    const e = experiment();
    await store.put('experiments', e);
    const a1 = assay(e.id, 'L1');
    const a2 = assay('other', 'L2');
    await store.putBatch({ assays: [a1, a2] });
    expect(await store.get('experiments', e.id)).toEqual(e);
    expect((await store.children('assays', e.id)).map((a) => a.line)).toEqual(['L1']);
    expect(await store.all('assays')).toHaveLength(2);
  });

  it('a write resolves after its transaction completes: a second connection sees it', async () => {
    const name = `test-${++dbCount}`;
    const first = await openIdbStore(name);
    const e = experiment();
    await first.put('experiments', revised(e, { name: 'Renamed' }));
    const second = await openIdbStore(name);
    const back = await second.get('experiments', e.id);
    expect(back?.name).toBe('Renamed');
    expect(back?.revision).toBe(2);
  });

  it('keeps Blobs of photos', async () => {
    const store = await freshStore();
    const photo: Photo = {
      ...newStamp(),
      plateId: 'p1',
      name: 'plate.jpg',
      blob: new Blob([new Uint8Array([1, 2, 3])], { type: 'image/jpeg' }),
      preview: new Blob([new Uint8Array([4])], { type: 'image/jpeg' }),
      width: 4000,
      height: 3000,
    };
    await store.put('photos', photo);
    const back = await store.get('photos', photo.id);
    expect(back?.blob.size).toBe(3);
    expect(new Uint8Array(await back!.blob.arrayBuffer())).toEqual(new Uint8Array([1, 2, 3]));
  });

  it('a batch that fails writes nothing', async () => {
    const store = await freshStore();
    const e = experiment();
    // The second record has no id, so IndexedDB rejects the put and aborts the transaction.
    const broken = { ...assay(e.id, 'L2'), id: undefined } as unknown as Assay;
    await expect(store.putBatch({ experiments: [e], assays: [broken] })).rejects.toBeTruthy();
    expect(await store.all('experiments')).toEqual([]);
  });

  it('removes the records named, of several kinds at once, and leaves the rest', async () => {
    const store = await freshStore();
    const e = experiment();
    const [a1, a2] = [assay(e.id, 'L1'), assay(e.id, 'L2')];
    await store.putBatch({ experiments: [e], assays: [a1, a2] });
    await store.remove({ experiments: [e.id], assays: [a1.id] });
    expect(await store.all('experiments')).toEqual([]);
    expect((await store.all('assays')).map((a) => a.id)).toEqual([a2.id]);
  });

  it('reports a stored record that fails the restore gate instead of returning it', async () => {
    const store = await freshStore();
    const bad = { ...assay('e1', 'L1'), foldDilutionSinceStart: -5 };
    await store.put('assays', bad);
    expect(await store.all('assays')).toEqual([]);
    // Listed once however often it is read, with the reason and the record as stored.
    await store.all('assays');
    const unreadable = await store.unreadable();
    expect(unreadable).toHaveLength(1);
    expect(unreadable[0]).toMatchObject({ kind: 'assays', id: bad.id, raw: bad });
    expect(unreadable[0]!.reason).toMatch(
      /assays record .*foldDilutionSinceStart: must be greater than 0/,
    );
  });

  it('tells subscribers after each completed write', async () => {
    const store = await freshStore();
    let calls = 0;
    const stop = store.subscribe(() => calls++);
    await store.put('experiments', experiment());
    await store.remove({ experiments: ['nothing'] });
    stop();
    await store.put('experiments', experiment());
    expect(calls).toBe(2);
  });

  it('tells subscribers of a write made through another connection (a second tab, the service worker)', async () => {
    const name = `test-${++dbCount}`;
    const page = await openIdbStore(name);
    const worker = await openIdbStore(name);
    const heard = new Promise<string[]>((done) =>
      page.subscribe(
        () => void page.all('experiments').then((all) => done(all.map((e) => e.name))),
      ),
    );
    await worker.put('experiments', experiment());
    expect(await heard).toEqual(['Test experiment']);
  });
});
