/**
 * The app's record store with every change of a synced kind also queued in the outbox, so the
 * screens keep using the one RecordStore interface and sync sees each change as it is made.
 * The record is written first and queued second; `rescan` (sync-round.ts) finds any change
 * whose queueing was cut off.
 */
import { KINDS, RECORD_KINDS } from '../../schema/kinds.ts';
import type { RecordKind, RecordsByKind } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { type SyncState, upsertEntry } from './sync-state.ts';

export function recordingStore(
  inner: RecordStore,
  state: SyncState,
  /** Awaited, so a write resolves only once the sync status counts it. */
  onQueued: () => Promise<void>,
  now: () => Date = () => new Date(),
): RecordStore {
  async function queueRecord<K extends RecordKind>(
    kind: K,
    record: RecordsByKind[K],
  ): Promise<void> {
    await state.queue(upsertEntry(kind, record, now().toISOString()));
  }

  return {
    unreadable: () => inner.unreadable(),
    get: (kind, id) => inner.get(kind, id),
    children: (kind, parentId) => inner.children(kind, parentId),
    all: (kind) => inner.all(kind),
    subscribe: (listener) => inner.subscribe(listener),
    async put(kind, record) {
      await inner.put(kind, record);
      if (!KINDS[kind].synced) return;
      await queueRecord(kind, record);
      await onQueued();
    },
    async putBatch(batch) {
      await inner.putBatch(batch);
      const kinds = RECORD_KINDS.filter((k) => KINDS[k].synced && batch[k]?.length);
      for (const kind of kinds)
        for (const record of batch[kind] ?? []) await queueRecord(kind, record);
      if (kinds.length) await onQueued();
    },
    async remove(ids) {
      // The tombstone carries the next revision, so it orders after the last edit of the record.
      const doomed: { kind: RecordKind; id: string; revision: number }[] = [];
      for (const kind of RECORD_KINDS.filter((k) => KINDS[k].synced)) {
        for (const id of ids[kind] ?? []) {
          const record = await inner.get(kind, id);
          if (record) doomed.push({ kind, id, revision: record.revision + 1 });
        }
      }
      await inner.remove(ids);
      const at = now().toISOString();
      for (const d of doomed)
        await state.queue({ ...d, updatedAt: at, deleted: true, body: null, queuedAt: at });
      if (doomed.length) await onQueued();
    },
  };
}
