/**
 * Records of an older format are upgraded on reading, from a backup file of the format the app
 * wrote before records carried one (fixtures/backup-format-1.json), from one of format 2 (assays
 * without a block, fixtures/backup-format-2.json) and from IndexedDB; a record from a newer app
 * is refused by name and listed, never half-read.
 */
import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { RECORD_FORMAT } from '../../schema/record-format.ts';
import type { Analysis, Assay, Experiment } from '../../schema/records.ts';
import { restoreRecord } from '../../schema/restore.ts';
import { readBackup } from '../exchange/backup.ts';
import { openIdbStore } from './idb-store.ts';

const FILE = resolve(import.meta.dirname, '../../fixtures/backup-format-1.json');
const FILE_2 = resolve(import.meta.dirname, '../../fixtures/backup-format-2.json');
let stores = 0;

describe('record formats', () => {
  it('reads a backup of format 1 whole, every record at the current format, times in one form', () => {
    const { batch, count } = readBackup(readFileSync(FILE, 'utf8'), 'backup-format-1.json');
    expect(count).toBe(5);
    for (const records of Object.values(batch))
      for (const r of records ?? []) expect(r.format).toBe(RECORD_FORMAT);
    // Written as 10:01 at +01:00 by hand; now in the form times are compared in.
    expect(batch.assays![0]!.updatedAt).toBe('2026-03-02T09:01:00.000Z');
  });

  it('upgrades a stored format-1 record on reading, and lists one from a newer app', async () => {
    const store = await openIdbStore(`format-${++stores}`);
    const doc = JSON.parse(readFileSync(FILE, 'utf8')) as { records: { assays: Assay[] } };
    const old = doc.records.assays[0]!;
    // Stored as the app of format 1 stored it: no format field.
    await store.put('assays', old);
    expect(await store.get('assays', old.id)).toEqual({
      ...old,
      updatedAt: '2026-03-02T09:01:00.000Z',
      block: null,
      format: RECORD_FORMAT,
    });
    const newer = { ...old, id: 'mf-L1-r2', format: RECORD_FORMAT + 1 };
    await store.put('assays', newer);
    expect(await store.get('assays', 'mf-L1-r2')).toBeUndefined();
    const [listed] = await store.unreadable();
    expect(listed).toMatchObject({ kind: 'assays', id: 'mf-L1-r2', raw: newer });
    expect(listed!.reason).toContain(
      `format: written by a newer version of the app (record format ${RECORD_FORMAT + 1}`,
    );
  });

  it('reads an experiment and a reading of format 2 (before learning) with learning on and nothing learned', async () => {
    const store = await openIdbStore(`format-${++stores}`);
    // As the app of format 2 wrote them: no learning, no candidates, no note of what read the plate.
    const experiment = {
      id: 'kx-exp',
      revision: 3,
      updatedAt: '2026-05-11T08:30:00.000Z',
      format: 2,
      name: 'Kestrel brook isolates',
      demo: false,
      lines: ['K1', 'K2'],
      referenceName: 'KB-anc',
      transferDilution: 100,
      defaultDilutionFold: 1e5,
      defaultVolumeUl: 100,
      markerColours: [
        { name: 'pink', hex: '#d0607a' },
        { name: 'cream', hex: '#efe3d3' },
      ],
      palette: null,
    };
    const analysis = {
      id: 'kx-a1',
      revision: 1,
      updatedAt: '2026-05-11T08:40:00.000Z',
      format: 2,
      plateId: 'kx-p1',
      photoId: 'kx-ph1',
      width: 4000,
      height: 3000,
      agarLab: [80, 1, 12],
      dish: null,
      colonies: [],
      classes: [
        { cls: 0, name: 'pink', hex: '#d0607a', deltaLab: [-10, 20, 2] },
        { cls: 1, name: 'cream', hex: '#efe3d3', deltaLab: [2, 0, 5] },
      ],
      flags: [],
      paletteUsed: false,
      ms: 900,
    };
    await store.put('experiments', experiment as unknown as Experiment);
    await store.put('analyses', analysis as unknown as Analysis);
    expect(await store.get('experiments', 'kx-exp')).toEqual({
      ...experiment,
      format: RECORD_FORMAT,
      learning: { enabled: true, model: null, since: null },
    });
    expect(await store.get('analyses', 'kx-a1')).toEqual({
      ...analysis,
      format: RECORD_FORMAT,
      learnedFrom: null,
      candidates: null,
    });
    expect(await store.unreadable()).toEqual([]);
  });

  it('refuses an experiment whose model is not text, naming the field', () => {
    const { batch } = readBackup(readFileSync(FILE, 'utf8'), 'backup-format-1.json');
    const experiment = batch.experiments![0]!;
    const bad = { ...experiment, learning: { enabled: true, model: { weights: [] } } };
    const r = restoreRecord('experiments', bad, 'backup.json, experiments[0]');
    expect(r).toEqual({
      ok: false,
      error: expect.stringMatching(/^backup\.json, experiments\[0\]: learning\.model: /),
    });
  });

  it('reads a backup of format 2 whole: assays gain a null block, nothing else changes', () => {
    const text = readFileSync(FILE_2, 'utf8');
    const before = JSON.parse(text) as { records: Record<string, Record<string, unknown>[]> };
    const { batch, count } = readBackup(text, 'backup-format-2.json');
    expect(count).toBe(5);
    const assay = batch.assays![0]!;
    expect(assay).toEqual({ ...before.records.assays![0], block: null, format: RECORD_FORMAT });
    expect(batch.plates![0]).toEqual({ ...before.records.plates![0], format: RECORD_FORMAT });
  });

  it('upgrades an assay stored at format 2 to one with a null block; a named block is kept', async () => {
    const store = await openIdbStore(`format-${++stores}`);
    const doc = JSON.parse(readFileSync(FILE_2, 'utf8')) as { records: { assays: Assay[] } };
    // Stored as the app of format 2 stored it: no block field.
    const old = doc.records.assays[0]!;
    await store.put('assays', old);
    expect(await store.get('assays', old.id)).toEqual({
      ...old,
      block: null,
      format: RECORD_FORMAT,
    });
    await store.put('assays', { ...old, id: 'mf-L1-r3', block: 'day 2', format: RECORD_FORMAT });
    expect((await store.get('assays', 'mf-L1-r3'))?.block).toBe('day 2');
    expect(await store.unreadable()).toEqual([]);
  });
});
