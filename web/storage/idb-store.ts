import { type IDBPDatabase, openDB } from 'idb';
import { KINDS, RECORD_KINDS } from '../../schema/kinds.ts';
import type { RecordKind, RecordsByKind } from '../../schema/records.ts';
import { restoreRecord } from '../../schema/restore.ts';
import type { RecordBatch, RecordIds, RecordStore, UnreadableRecord } from './record-store.ts';

const DB_VERSION = 1;
const PARENT_INDEX = 'byParent';

/** One object store per record kind, keyed by id, with an index on the parent id. */
async function open(name: string): Promise<IDBPDatabase> {
  return openDB(name, DB_VERSION, {
    upgrade(db) {
      for (const kind of RECORD_KINDS) {
        if (db.objectStoreNames.contains(kind)) continue;
        const os = db.createObjectStore(kind, { keyPath: 'id' });
        const parent = KINDS[kind].parent;
        if (parent) os.createIndex(PARENT_INDEX, String(parent));
      }
    },
  });
}

export async function openIdbStore(name = 'rivalplate'): Promise<RecordStore> {
  const db = await open(name);
  const listeners = new Set<() => void>();
  const notify = () => {
    for (const l of listeners) l();
  };
  // Writes made in another tab, or by the service worker's background sync, show here too.
  const channel =
    typeof BroadcastChannel === 'undefined' ? null : new BroadcastChannel(`${name}-changes`);
  if (channel) {
    channel.onmessage = notify;
    // Node (the tests) would otherwise stay alive for the channel.
    (channel as { unref?: () => void }).unref?.();
  }
  const changed = () => {
    notify();
    channel?.postMessage('changed');
  };

  const check = (kind: RecordKind, item: unknown) =>
    restoreRecord(
      kind,
      item,
      `stored ${kind} record ${String((item as { id?: unknown } | null)?.id)}`,
    );

  /** The records that pass the gate; the others are listed by `unreadable`. */
  function restored<K extends RecordKind>(kind: K, raw: unknown[]): RecordsByKind[K][] {
    const out: RecordsByKind[K][] = [];
    for (const item of raw) {
      const r = check(kind, item);
      if (r.ok) out.push(r.record as RecordsByKind[K]);
    }
    return out;
  }

  /** One transaction over every kind touched. */
  async function write(batch: RecordBatch, remove: RecordIds): Promise<void> {
    const kinds = RECORD_KINDS.filter((k) => batch[k]?.length || remove[k]?.length);
    if (kinds.length === 0) return;
    const tx = db.transaction(kinds, 'readwrite');
    const requests: Promise<unknown>[] = [];
    try {
      for (const k of kinds) {
        for (const id of remove[k] ?? []) requests.push(tx.objectStore(k).delete(id));
        for (const r of batch[k] ?? []) requests.push(tx.objectStore(k).put(r));
      }
    } catch (e) {
      // A put can throw at once (a record without its key); that alone does not abort the
      // transaction, so the records before it would commit. Abort so a batch is all or nothing;
      // the aborted requests' rejections are expected and consumed here.
      tx.abort();
      await Promise.allSettled([...requests, tx.done]);
      throw e;
    }
    await Promise.all([...requests, tx.done]);
    changed();
  }

  return {
    async unreadable() {
      const out: UnreadableRecord[] = [];
      for (const kind of RECORD_KINDS)
        for (const raw of await db.getAll(kind)) {
          const r = check(kind, raw);
          if (!r.ok)
            out.push({ kind, id: String((raw as { id?: unknown }).id), reason: r.error, raw });
        }
      return out;
    },
    async put(kind, record) {
      const tx = db.transaction(kind, 'readwrite');
      await Promise.all([tx.store.put(record), tx.done]);
      changed();
    },
    putBatch: (batch) => write(batch, {}),
    remove: (ids) => write({}, ids),
    async get(kind, id) {
      const raw = await db.get(kind, id);
      return raw === undefined ? undefined : restored(kind, [raw])[0];
    },
    async children(kind, parentId) {
      return restored(kind, await db.getAllFromIndex(kind, PARENT_INDEX, parentId));
    },
    async all(kind) {
      return restored(kind, await db.getAll(kind));
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}
