/**
 * Which engine the server tests run on, and a fresh database of it for each test server. The same
 * test files run twice (vitest.config.ts): in the `sqlite` project a database is a temporary data
 * folder; in the `postgres` project, whose global setup starts a throwaway cluster
 * (tests/support/postgres-global-setup.ts), it is a new database on that cluster, named by its
 * postgres:// URL. Tests hold either as one string, `where`, and reach it only through here.
 */
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import pg from 'pg';
import { inject } from 'vitest';
import { DATABASE_FILE } from '../../server/data-folder.ts';
import { isPostgresUrl, openStore } from '../../server/open-store.ts';
import type { SyncStore } from '../../server/storage/sync-store.ts';

export type Engine = 'sqlite' | 'postgres';

const clusterUrl: string | undefined = inject('postgresUrl');
export const ENGINE: Engine = clusterUrl ? 'postgres' : 'sqlite';

export function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'rivalplate-sync-'));
}

/** The URL of `database` on the same cluster as `url`. */
export function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

/** An empty database of the engine under test: a data folder, or a postgres:// URL. */
export async function freshDatabase(): Promise<string> {
  if (!clusterUrl) return tempDir();
  const name = `rp_${randomBytes(6).toString('hex')}`;
  await adminQuery(clusterUrl, `CREATE DATABASE ${name}`);
  return withDatabase(clusterUrl, name);
}

/** Removes a database from freshDatabase, connections to it included. */
export async function dropDatabase(where: string): Promise<void> {
  if (!isPostgresUrl(where)) return rmSync(where, { recursive: true, force: true });
  const name = new URL(where).pathname.slice(1);
  await adminQuery(withDatabase(where, 'postgres'), `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
}

async function adminQuery(url: string, sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

export function openTestStore(where: string, maxBytes?: number): Promise<SyncStore> {
  return openStore(
    isPostgresUrl(where) ? { dataDir: '', db: where } : { dataDir: where, maxBytes },
  ).then((s) => s.store);
}

/** BIGINT and counts as numbers, as SQLite gives them. */
const types = {
  getTypeParser(oid: number, format?: 'text' | 'binary') {
    if (oid === 20 || oid === 1700) return (v: string) => Number(v);
    return pg.types.getTypeParser(oid, format);
  },
} as pg.CustomTypesConfig;

/**
 * A connection of its own to the database, as another process sees it: `rows` runs a statement
 * written with `?` placeholders (numbered for PostgreSQL) and returns its rows.
 */
export interface DatabaseReader {
  rows(sql: string, ...params: unknown[]): Promise<unknown[]>;
  close(): Promise<void>;
}

export async function openReader(
  where: string,
  options: { write?: boolean } = {},
): Promise<DatabaseReader> {
  if (!isPostgresUrl(where)) {
    const db = new Database(join(where, DATABASE_FILE), { readonly: !options.write });
    return {
      async rows(sql, ...params) {
        const statement = db.prepare(sql);
        if (statement.reader) return statement.all(...params);
        statement.run(...params);
        return [];
      },
      async close() {
        db.close();
      },
    };
  }
  const client = new pg.Client({ connectionString: where, types });
  await client.connect();
  return {
    async rows(sql, ...params) {
      let n = 0;
      return (
        await client.query(
          sql.replace(/\?/g, () => `$${++n}`),
          params,
        )
      ).rows;
    },
    close: () => client.end(),
  };
}

/** One statement on its own connection. */
export async function queryOnce(
  where: string,
  sql: string,
  ...params: unknown[]
): Promise<unknown[]> {
  const reader = await openReader(where, { write: true });
  try {
    return await reader.rows(sql, ...params);
  } finally {
    await reader.close();
  }
}
