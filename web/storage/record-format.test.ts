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
import type { Assay } from '../../schema/records.ts';
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
