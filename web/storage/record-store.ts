import type { RecordKind, RecordsByKind } from '../../schema/records.ts';

/** A batch of records of several kinds, written in one transaction (all or nothing). */
export type RecordBatch = { [K in RecordKind]?: RecordsByKind[K][] };

/** Ids of records to delete, per kind. */
export type RecordIds = { [K in RecordKind]?: string[] };

/** A stored record that fails the restore gate: which, why, and the record as it is stored. */
export interface UnreadableRecord {
  kind: RecordKind;
  /** The stored id, as text (it may be the very field that is wrong). */
  id: string;
  reason: string;
  raw: unknown;
}

/**
 * Where the app keeps its records. Every write resolves only once its transaction has
 * completed, so a record the UI shows as saved survives the tab being closed. Every read passes
 * the schema's restore gate; a record that fails it is left out of what reads return, and listed
 * by `unreadable`, so a screen can say which records could not be read and why.
 */
export interface RecordStore {
  put<K extends RecordKind>(kind: K, record: RecordsByKind[K]): Promise<void>;
  /** Writes every record of `batch` in one transaction: all of them or none. */
  putBatch(batch: RecordBatch): Promise<void>;
  /** Deletes the records named, in one transaction. */
  remove(ids: RecordIds): Promise<void>;
  get<K extends RecordKind>(kind: K, id: string): Promise<RecordsByKind[K] | undefined>;
  /** Records whose parent field (see schema KINDS) holds `parentId`. */
  children<K extends RecordKind>(kind: K, parentId: string): Promise<RecordsByKind[K][]>;
  all<K extends RecordKind>(kind: K): Promise<RecordsByKind[K][]>;
  /** Calls `listener` after every completed write; returns the unsubscribe function. */
  subscribe(listener: () => void): () => void;
  /** Every stored record that fails the restore gate now, read afresh on each call. */
  unreadable(): Promise<UnreadableRecord[]>;
}
