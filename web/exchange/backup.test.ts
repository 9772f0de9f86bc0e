import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import type { Photo } from '../../schema/records.ts';
import { newAssay, nextAssayDraft } from '../bench/assays.ts';
import { newExperiment } from '../bench/experiments.ts';
import { openIdbStore } from '../storage/idb-store.ts';
import { newStamp, revised } from '../storage/stamp.ts';
import { backupJson, newerOnly, readBackup } from './backup.ts';

let n = 0;
async function seeded() {
  const store = await openIdbStore(`backup-${++n}`);
  const e = newExperiment({
    name: 'Backup test',
    lines: ['L1'],
    referenceName: 'anc',
    transferDilution: 100,
    defaultDilutionFold: 1e5,
    defaultVolumeUl: 100,
  });
  const a = newAssay(e, {
    line: 'L1',
    generation: 100,
    replicate: 1,
    group: '',
    testClass: 1,
    foldDilutionSinceStart: 100,
    days: 1,
    block: '',
    startDilutionFold: 1e5,
    endDilutionFold: 1e5,
    volumeUl: 100,
  });
  const photo: Photo = {
    ...newStamp(),
    plateId: a.plates[0].id,
    name: 'p.jpg',
    blob: new Blob([new Uint8Array([255, 216, 255, 0, 7])], { type: 'image/jpeg' }),
    preview: null,
    width: null,
    height: null,
  };
  await store.putBatch({
    experiments: [e],
    assays: [a.assay],
    samples: a.samples,
    plates: a.plates,
    photos: [photo],
  });
  return { store, e, photo };
}

describe('backup file', () => {
  it('restores every record, photo bytes included, on another device', async () => {
    const { store, photo } = await seeded();
    const json = await backupJson(store);
    const { batch, count } = readBackup(json, 'b.json');
    expect(count).toBe(1 + 1 + 2 + 2 + 1);
    const other = await openIdbStore(`backup-${++n}`);
    await other.putBatch(batch);
    const back = await other.get('photos', photo.id);
    expect(new Uint8Array(await back!.blob.arrayBuffer())).toEqual(
      new Uint8Array([255, 216, 255, 0, 7]),
    );
    expect(await other.all('plates')).toHaveLength(2);
  });

  it('leaves the demo experiment out, with everything of it', async () => {
    const { store } = await seeded();
    const demo = newExperiment(
      {
        name: 'Demo',
        lines: ['L1'],
        referenceName: 'anc',
        transferDilution: 100,
        defaultDilutionFold: 1e5,
        defaultVolumeUl: 100,
      },
      true,
    );
    const a = newAssay(demo, { ...nextAssayDraft(demo, [], [], []) });
    await store.putBatch({
      experiments: [demo],
      assays: [a.assay],
      samples: a.samples,
      plates: a.plates,
    });
    const { batch } = readBackup(await backupJson(store), 'b.json');
    expect(batch.experiments!.map((e) => e.name)).toEqual(['Backup test']);
    expect(batch.plates).toHaveLength(2);
  });

  it('a bad record is reported by file, record and field, and nothing is restored', async () => {
    const { store } = await seeded();
    const doc = JSON.parse(await backupJson(store));
    doc.records.plates[1].volumeUl = -5;
    delete doc.records.assays[0].line;
    expect(() => readBackup(JSON.stringify(doc), 'b.json')).toThrow(
      /b\.json, assays\[0\]: line: expected text, got undefined\nb\.json, plates\[1\]: volumeUl: must be greater than 0, got -5/,
    );
  });

  it('refuses what is not a backup, or a newer version, by name', () => {
    expect(() => readBackup('{', 'x.json')).toThrow(/x\.json: not a JSON file/);
    expect(() => readBackup('{"a":1}', 'x.json')).toThrow(/x\.json: not a Rivalplate backup/);
    expect(() =>
      readBackup('{"format":"rivalplate-backup","version":9,"records":{}}', 'x.json'),
    ).toThrow(/backup version 9; this app reads version 1/);
  });

  it('restoring never rolls a record back to an older revision', async () => {
    const { store, e } = await seeded();
    const { batch } = readBackup(await backupJson(store), 'b.json');
    await store.put('experiments', revised(e, { name: 'Renamed later' }));
    const kept = await newerOnly(store, batch);
    expect(kept.experiments).toEqual([]);
    expect(kept.assays).toEqual([]); // the same revision is the same record: nothing to write
  });
});
