/** Where the server keeps its data: one SQLite file in a folder the operator names. */
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { openSqliteStore } from './storage/sqlite-store.ts';
import type { SyncStore } from './storage/sync-store.ts';

export const DATABASE_FILE = 'rivalplate-sync.sqlite';

/** A data folder or database file the server cannot use; the message names the file and why. */
export class DataFolderError extends Error {}

/** Creates the folder and the database on first use. */
export function openDataFolder(dir: string, maxBytes?: number): { store: SyncStore; file: string } {
  const file = resolve(join(dir, DATABASE_FILE));
  try {
    mkdirSync(dir, { recursive: true });
    return { store: openSqliteStore({ file, ...(maxBytes ? { maxBytes } : {}) }), file };
  } catch (e) {
    // Not a database, one from a newer server, a folder without write access: nothing was changed.
    throw new DataFolderError(`cannot use ${file}: ${(e as Error).message}`);
  }
}
