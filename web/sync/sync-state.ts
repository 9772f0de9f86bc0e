/**
 * What sync keeps on the phone, in its own IndexedDB database beside the app's records: the
 * outbox of local changes not yet on the server, the server revisions each record was last seen
 * at (what its next edit `replaces`), unresolved conflicts, and a few settings. Every write
 * resolves only once its transaction has completed, so a queued change survives a reload.
 */
import { type DBSchema, type IDBPDatabase, openDB } from 'idb';
import type { RecordKind, RecordsByKind } from '../../schema/records.ts';
import type { Change, Receipt, Revision } from '../../schema/sync-protocol.ts';

/**
 * A local change waiting for the server; a later change of the same record replaces it. A change
 * the server refused on its own (`refusal`) stays here, out of the pushes, until it is edited.
 */
export type OutboxEntry = Omit<Change, 'replaces'> & { queuedAt: string; refusal?: string };

/** The outbox entry that sends a stored record as it now is. */
export function upsertEntry<K extends RecordKind>(
  kind: K,
  record: RecordsByKind[K],
  queuedAt: string,
): OutboxEntry {
  const { id, revision, updatedAt } = record;
  return { kind, id, revision, updatedAt, deleted: false, body: record, queuedAt };
}

/**
 * What the phone knows the server holds of a record: the heads its next edit replaces, and the
 * revision they carry, so a change that never reached the outbox can be found again (rescan).
 */
export interface KnownEntry {
  kind: RecordKind;
  id: string;
  hashes: string[];
  revision: number;
  deleted: boolean;
}

/** A record with more than one head on the server, kept until the person resolves it. */
export interface ConflictEntry {
  kind: RecordKind;
  id: string;
  heads: Revision[];
  seenAt: string;
}

export interface SyncSettings {
  serverUrl: string;
  token: string;
}

interface Meta {
  settings: SyncSettings | null;
  cursor: string;
  device: string;
  lastSuccessAt: string | null;
  /**
   * Set when the server refused the cursor as not from its history (a restored database): pulls
   * start over from the beginning until one has run to the end, kept here so a round cut short
   * starts over too.
   */
  reconcile: boolean;
}

interface SyncDb extends DBSchema {
  outbox: { key: [string, string]; value: OutboxEntry; indexes: { byQueued: string } };
  known: { key: [string, string]; value: KnownEntry };
  conflicts: { key: [string, string]; value: ConflictEntry };
  meta: { key: string; value: unknown };
}

export interface SyncState {
  /** Queues a change, replacing any older one of the same record still waiting. */
  queue(entry: OutboxEntry): Promise<void>;
  /** The oldest waiting changes not refused, with what each replaces. */
  pending(max: number): Promise<Change[]>;
  /** Sets a change aside with the server's reason, so it no longer holds up the others. */
  refuse(kind: RecordKind, id: string, revision: number, reason: string): Promise<void>;
  refused(): Promise<OutboxEntry[]>;
  waiting(): Promise<number>;
  isWaiting(kind: RecordKind, id: string): Promise<boolean>;
  /**
   * After a push: drops each entry the server took, unless it changed again meanwhile, and
   * remembers the revision the server named.
   */
  settle(receipts: Receipt[], pushed: Change[]): Promise<void>;
  setKnown(entry: KnownEntry): Promise<void>;
  dropKnown(kind: RecordKind, id: string): Promise<void>;
  known(kind: RecordKind, id: string): Promise<KnownEntry | undefined>;
  allKnown(): Promise<KnownEntry[]>;
  putConflict(entry: ConflictEntry): Promise<void>;
  dropConflict(kind: RecordKind, id: string): Promise<void>;
  conflicts(): Promise<ConflictEntry[]>;
  meta<K extends keyof Meta>(key: K): Promise<Meta[K]>;
  setMeta<K extends keyof Meta>(key: K, value: Meta[K]): Promise<void>;
  close(): void;
}

const META_DEFAULTS: () => Meta = () => ({
  settings: null,
  cursor: '0',
  device: crypto.randomUUID(),
  lastSuccessAt: null,
  reconcile: false,
});

export async function openSyncState(name = 'rivalplate-sync'): Promise<SyncState> {
  const db: IDBPDatabase<SyncDb> = await openDB<SyncDb>(name, 1, {
    upgrade(d) {
      // Every store is keyed by [kind, id]: ids are unique only within their kind.
      d.createObjectStore('outbox', { keyPath: ['kind', 'id'] }).createIndex(
        'byQueued',
        'queuedAt',
      );
      d.createObjectStore('known', { keyPath: ['kind', 'id'] });
      d.createObjectStore('conflicts', { keyPath: ['kind', 'id'] });
      d.createObjectStore('meta');
    },
  });

  async function meta<K extends keyof Meta>(key: K): Promise<Meta[K]> {
    const stored = (await db.get('meta', key)) as Meta[K] | undefined;
    if (stored !== undefined) return stored;
    const fallback = META_DEFAULTS()[key];
    // The device id must stay the same once made: store it the first time it is asked for.
    if (key === 'device') await db.put('meta', fallback, key);
    return fallback;
  }

  return {
    async queue(entry) {
      await db.put('outbox', entry);
    },
    async pending(max) {
      const tx = db.transaction(['outbox', 'known']);
      const changes: Change[] = [];
      let cursor = await tx.objectStore('outbox').index('byQueued').openCursor();
      while (cursor && changes.length < max) {
        const { queuedAt: _, refusal, ...entry } = cursor.value;
        if (refusal === undefined) {
          const known = await tx.objectStore('known').get([entry.kind, entry.id]);
          changes.push({ ...entry, replaces: known?.hashes ?? [] });
        }
        cursor = await cursor.continue();
      }
      await tx.done;
      return changes;
    },
    async refuse(kind, id, revision, reason) {
      const tx = db.transaction('outbox', 'readwrite');
      const entry = await tx.store.get([kind, id]);
      // Edited again since it was sent: the new version deserves its own try.
      if (entry && entry.revision === revision) await tx.store.put({ ...entry, refusal: reason });
      await tx.done;
    },
    async refused() {
      return (await db.getAll('outbox')).filter((e) => e.refusal !== undefined);
    },
    waiting: () => db.count('outbox'),
    async isWaiting(kind, id) {
      return (await db.getKey('outbox', [kind, id])) !== undefined;
    },
    async settle(receipts, pushed) {
      const deleted = new Set(pushed.filter((c) => c.deleted).map((c) => `${c.kind}/${c.id}`));
      const tx = db.transaction(['outbox', 'known'], 'readwrite');
      const outbox = tx.objectStore('outbox');
      await Promise.all(
        receipts.map(async (r) => {
          const entry = await outbox.get([r.kind, r.id]);
          if (entry && entry.revision === r.revision) await outbox.delete([r.kind, r.id]);
          await tx.objectStore('known').put({
            kind: r.kind,
            id: r.id,
            hashes: [r.hash],
            revision: r.revision,
            deleted: deleted.has(`${r.kind}/${r.id}`),
          });
        }),
      );
      await tx.done;
    },
    async setKnown(entry) {
      await db.put('known', entry);
    },
    async dropKnown(kind, id) {
      await db.delete('known', [kind, id]);
    },
    known: (kind, id) => db.get('known', [kind, id]),
    allKnown: () => db.getAll('known'),
    async putConflict(entry) {
      await db.put('conflicts', entry);
    },
    async dropConflict(kind, id) {
      await db.delete('conflicts', [kind, id]);
    },
    conflicts: () => db.getAll('conflicts'),
    meta,
    async setMeta(key, value) {
      await db.put('meta', value, key);
    },
    close: () => db.close(),
  };
}
