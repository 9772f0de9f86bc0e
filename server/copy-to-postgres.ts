/**
 * `rivalplate server copy --from DIR --to postgres://...`: moves a lab server up from its SQLite
 * data folder to PostgreSQL. Every row goes across as it is (labs, tokens, revisions with their
 * seqs, heads, uploads and photo chunks), so the phones' cursors and tokens keep working against
 * the new server. The source is read in one snapshot (a server still running on it may go on; what
 * it writes after the copy began is not copied); the target is written in one transaction that
 * commits only after the counts and a SHA-256 of every table, read back from the target inside
 * that transaction, match the source's: a failed copy leaves the target as empty as it was. A
 * target that holds any data already is refused.
 */
import { createHash, type Hash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import pg from 'pg';
import { DATABASE_FILE, DataFolderError, openDataFolder } from './data-folder.ts';
import { describeUrl, openPostgresStore } from './storage/postgres-store.ts';

interface TableCopy {
  name: string;
  columns: string[];
  /** Order for reading both sides the same way (text compared as bytes in both). */
  order: { sqlite: string; postgres: string };
}

/** Parents before children, so the foreign keys hold at every insert. */
const TABLES: TableCopy[] = [
  {
    name: 'labs',
    columns: [
      'id',
      'name',
      'photos_enabled',
      'photo_max_bytes',
      'created_at',
      'max_bytes',
      'used_bytes',
    ],
    order: { sqlite: 'id', postgres: 'id' },
  },
  {
    name: 'tokens',
    columns: ['hash', 'lab_id', 'created_at', 'label', 'last_used_on', 'revoked_at'],
    // SQLite lists a lab's tokens by rowid after the time; PostgreSQL's `ord` keeps that order.
    order: { sqlite: 'rowid', postgres: 'ord' },
  },
  {
    name: 'revisions',
    columns: [
      'seq',
      'lab_id',
      'kind',
      'record_id',
      'hash',
      'revision',
      'updated_at',
      'deleted',
      'body',
      'device',
      'received_at',
    ],
    order: { sqlite: 'seq', postgres: 'seq' },
  },
  {
    name: 'records',
    columns: ['lab_id', 'kind', 'record_id', 'last_seq', 'heads'],
    order: {
      sqlite: 'lab_id, kind, record_id',
      postgres: 'lab_id, kind COLLATE "C", record_id COLLATE "C"',
    },
  },
  {
    name: 'uploads',
    columns: [
      'lab_id',
      'photo_id',
      'plate_id',
      'bytes',
      'type',
      'sha256',
      'received',
      'complete',
      'touched_at',
    ],
    order: { sqlite: 'lab_id, photo_id', postgres: 'lab_id, photo_id COLLATE "C"' },
  },
  {
    name: 'chunks',
    columns: ['lab_id', 'photo_id', 'start', 'data'],
    order: { sqlite: 'lab_id, photo_id, start', postgres: 'lab_id, photo_id COLLATE "C", start' },
  },
];

/** Rows per INSERT, and bytes: photo chunks go a few at a time. */
const BATCH_ROWS = 500;
const BATCH_BYTES = 8 * 1024 * 1024;

export interface CopyReport {
  source: string;
  target: string;
  tables: { name: string; rows: number; sha256: string }[];
  bytes: number;
}

/** A copy that cannot be made: the message says why; nothing was written. */
export class CopyError extends Error {}

type Row = Record<string, unknown>;

function addRow(hash: Hash, columns: string[], row: Row): void {
  for (const c of columns) {
    const v = row[c];
    // Each value with its type and length, so no two different rows hash alike.
    if (v === null || v === undefined) hash.update('n;');
    else if (Buffer.isBuffer(v)) hash.update(`b${v.length};`).update(v);
    else if (typeof v === 'number' || typeof v === 'bigint') hash.update(`i${v};`);
    else {
      const text = Buffer.from(String(v));
      hash.update(`t${text.length};`).update(text);
    }
  }
}

const types = {
  getTypeParser(oid: number, format?: 'text' | 'binary') {
    if (oid === 20 || oid === 1700) return (v: string) => Number(v);
    return pg.types.getTypeParser(oid, format);
  },
} as pg.CustomTypesConfig;

export async function copyToPostgres(
  dataDir: string,
  url: string,
  password?: string,
): Promise<CopyReport> {
  const file = join(dataDir, DATABASE_FILE);
  if (!existsSync(file))
    throw new CopyError(
      `no sync database in ${dataDir}: give the server's data folder with --from`,
    );
  // Brings an older file to the current schema first, as starting the server would.
  await openDataFolder(dataDir).store.close();
  // The target gets its tables (or is checked to be of a schema this server knows).
  try {
    await (
      await openPostgresStore({ url, ...(password !== undefined ? { password } : {}) })
    ).close();
  } catch (e) {
    throw new DataFolderError(`cannot use ${describeUrl(url)}: ${(e as Error).message}`);
  }

  const source = new Database(file, { readonly: true });
  const target = new pg.Client({
    connectionString: url,
    ...(password !== undefined ? { password } : {}),
    types,
  });
  await target.connect();
  target.on('error', () => {});
  try {
    // One snapshot of the source for the whole copy.
    source.exec('BEGIN');
    await target.query('BEGIN ISOLATION LEVEL SERIALIZABLE');
    // No other copy or server writes while this one fills the tables.
    await target.query(`LOCK TABLE ${TABLES.map((t) => t.name).join(', ')} IN EXCLUSIVE MODE`);
    const held = await target.query<{ n: number }>(
      `SELECT (${TABLES.map((t) => `(SELECT count(*) FROM ${t.name})`).join(' + ')}) AS n`,
    );
    if (held.rows[0]!.n > 0)
      throw new CopyError(
        `${describeUrl(url)} holds data already (${held.rows[0]!.n} rows): copy only into an empty database`,
      );

    const report: CopyReport = {
      source: file,
      target: describeUrl(url),
      tables: [],
      bytes: 0,
    };
    for (const table of TABLES) {
      const hash = createHash('sha256');
      let rows = 0;
      let batch: Row[] = [];
      let batchBytes = 0;
      const flush = async () => {
        if (batch.length === 0) return;
        const values: unknown[] = [];
        const tuples = batch.map((row) => {
          const marks = table.columns.map((c) => {
            values.push(row[c]);
            return `$${values.length}`;
          });
          return `(${marks.join(', ')})`;
        });
        await target.query(
          `INSERT INTO ${table.name} (${table.columns.join(', ')}) VALUES ${tuples.join(', ')}`,
          values,
        );
        batch = [];
        batchBytes = 0;
      };
      const read = source.prepare(
        `SELECT ${table.columns.join(', ')} FROM ${table.name} ORDER BY ${table.order.sqlite}`,
      );
      for (const row of read.iterate() as Iterable<Row>) {
        addRow(hash, table.columns, row);
        rows += 1;
        const size = Buffer.isBuffer(row.data) ? row.data.length : 0;
        report.bytes += size;
        batch.push(row);
        batchBytes += size;
        if (batch.length >= BATCH_ROWS || batchBytes >= BATCH_BYTES) await flush();
      }
      await flush();
      report.tables.push({ name: table.name, rows, sha256: hash.digest('hex') });
    }
    // Identities go on after the highest copied value, so new labs and revisions do not collide.
    for (const [tableName, column] of [
      ['labs', 'id'],
      ['revisions', 'seq'],
      ['tokens', 'ord'],
    ])
      await target.query(
        `SELECT setval(pg_get_serial_sequence('${tableName}', '${column}'), coalesce((SELECT max(${column}) FROM ${tableName}), 0) + 1, false)`,
      );

    // Read everything back from the target, in the same order, before committing.
    for (const [i, table] of TABLES.entries()) {
      const hash = createHash('sha256');
      let rows = 0;
      const cursor = `verify_${table.name}`;
      await target.query(
        `DECLARE ${cursor} NO SCROLL CURSOR FOR SELECT ${table.columns.join(', ')} FROM ${table.name} ORDER BY ${table.order.postgres}`,
      );
      for (;;) {
        const page = await target.query<Row>(`FETCH 200 FROM ${cursor}`);
        for (const row of page.rows) addRow(hash, table.columns, row);
        rows += page.rows.length;
        if (page.rows.length < 200) break;
      }
      await target.query(`CLOSE ${cursor}`);
      const expected = report.tables[i]!;
      const digest = hash.digest('hex');
      if (rows !== expected.rows || digest !== expected.sha256)
        throw new CopyError(
          `table ${table.name}: the target holds ${rows} rows (SHA-256 ${digest.slice(0, 12)}…) where the source has ${expected.rows} (${expected.sha256.slice(0, 12)}…): nothing was copied`,
        );
    }
    await target.query('COMMIT');
    return report;
  } catch (e) {
    await target.query('ROLLBACK').catch(() => {});
    throw e;
  } finally {
    if (source.inTransaction) source.exec('COMMIT');
    source.close();
    await target.end();
  }
}
