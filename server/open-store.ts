/**
 * Opens the store the operator chose: the SQLite file in a data folder (the default), or a
 * PostgreSQL database named by a postgres:// URL. The password of the URL may be left out and
 * given in RIVALPLATE_DB_PASSWORD instead (or PGPASSWORD, or ~/.pgpass, as libpq reads them).
 */
import { DataFolderError, openDataFolder } from './data-folder.ts';
import { describeUrl, openPostgresStore } from './storage/postgres-store.ts';
import type { SyncStore } from './storage/sync-store.ts';

/** Where the password of a postgres:// URL may come from instead of the URL itself. */
export const DB_PASSWORD_ENV = 'RIVALPLATE_DB_PASSWORD';

export const isPostgresUrl = (text: string) => /^postgres(ql)?:\/\//i.test(text);

export interface StoreChoice {
  /** A data folder (SQLite). */
  dataDir: string;
  /** A postgres:// URL: used instead of the data folder when given. */
  db?: string | undefined;
  /** SQLite only: caps the database file. */
  maxBytes?: number | undefined;
}

export async function openStore(
  choice: StoreChoice,
  env: NodeJS.ProcessEnv = process.env,
): Promise<{ store: SyncStore; where: string }> {
  if (choice.db === undefined) {
    const { store, file } = openDataFolder(choice.dataDir, choice.maxBytes);
    return { store, where: file };
  }
  if (!isPostgresUrl(choice.db))
    throw new DataFolderError(
      `--db expects a postgres://user@host:port/database URL, got "${describeUrl(choice.db)}"`,
    );
  const password = env[DB_PASSWORD_ENV];
  try {
    const store = await openPostgresStore({
      url: choice.db,
      ...(password !== undefined ? { password } : {}),
    });
    return { store, where: describeUrl(choice.db) };
  } catch (e) {
    throw new DataFolderError(`cannot use ${describeUrl(choice.db)}: ${(e as Error).message}`);
  }
}
