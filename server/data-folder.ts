/** Where the server keeps its data: one SQLite file in a folder the operator names. */
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { openSqliteStore } from './storage/sqlite-store.ts';
import type { SyncStore } from './storage/sync-store.ts';

export const DATABASE_FILE = 'rivalplate-sync.sqlite';

/** Creates the folder and the database on first use. */
export function openDataFolder(dir: string, maxBytes?: number): { store: SyncStore; file: string } {
  mkdirSync(dir, { recursive: true });
  const file = resolve(join(dir, DATABASE_FILE));
  return { store: openSqliteStore({ file, ...(maxBytes ? { maxBytes } : {}) }), file };
}
