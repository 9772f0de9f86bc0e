/**
 * The PostgreSQL engine behind SyncStore: everything the server keeps (labs, tokens, revisions,
 * heads, uploads and photo chunks) lives in the database, so a server process holds no state of
 * its own and any number of them can serve one database; any of them takes the next chunk of an
 * upload another one started. Its statements sit beside SQLite's in sql.ts; the rules (how heads
 * move, what a lab may store, when an upload is whole) are the same as sqlite-store.ts's, step for
 * step.
 *
 * Concurrency. Each write runs in one READ COMMITTED transaction that first takes the lab's
 * transaction-scoped advisory lock (`pg_advisory_xact_lock(1919, lab id)`, released by the
 * commit or rollback): pushes, upload starts and chunks of one lab run one at a time, whichever
 * process took them, while other labs go on in parallel. Under the lock a push reads the current
 * heads, so two processes pushing to one record end with the heads one process would leave (no
 * head lost, no revision stored twice: the repeat check and the UNIQUE key agree); the byte cap is
 * checked and charged under it too. The lock also makes the pull cursor safe: a revision's seq is
 * drawn from the identity sequence while the lock is held, and PostgreSQL makes a transaction
 * visible before it releases its locks, so within a lab seq order is commit order. A pull reads
 * in one REPEATABLE READ snapshot, which therefore holds every revision of the lab up to some seq
 * and none after it: a cursor never passes a record that commits later with a smaller seq.
 * (Seqs of different labs interleave, and a rolled-back push leaves a gap; cursors are per lab
 * and only ever compare.)
 *
 * A database that goes away (restarted, failed over) fails the requests in flight with
 * `server-fault`; the phone retries them, a retried push is recognised as a repeat, and the pool
 * opens new connections once the database is back.
 */
import { createHash } from 'node:crypto';
import pg from 'pg';
import {
  type Cursor,
  formatCursor,
  type PhotoUploadRequest,
  type PulledRecord,
  type PullResponse,
  type PushResponse,
  type Receipt,
  SYNC_LIMITS,
} from '../../schema/sync-protocol.ts';
import { headsAfter } from '../heads.ts';
import { SyncRefusal } from '../refusal.ts';
import { tokenId } from '../tokens.ts';
import {
  ABANDONED_MS,
  type LabRow,
  labFromRow,
  mb,
  PAGE_OVERHEAD,
  type RevisionRow,
  revisionFromRow,
  storedBytes,
  type TokenRow,
  tokenFromRow,
  type UploadRow,
  uploadFromRow,
} from './rows.ts';
import { forPostgres, POSTGRES_MIGRATIONS, type StatementName } from './sql.ts';
import type {
  HashedChange,
  LabSettings,
  SyncStore,
  TokenAccess,
  TokenInfo,
  Upload,
} from './sync-store.ts';
import { REVISIONS_KEPT } from './sync-store.ts';

export interface PostgresOptions {
  /** postgres://user@host:port/database (libpq's URL form); the password may be left out of it. */
  url: string;
  /** The password, when not in the URL (the command line reads RIVALPLATE_DB_PASSWORD). */
  password?: string;
  /** Connections this process keeps open at most (default 10). */
  poolSize?: number;
}

/** Schema versions this server knows; a database from a newer server is refused on open. */
const SCHEMA_VERSION = POSTGRES_MIGRATIONS.length;

/** BIGINT and numeric come back as text by default; every one here fits a double exactly. */
const types = {
  getTypeParser(oid: number, format?: 'text' | 'binary') {
    if (oid === 20 || oid === 1700) return (v: string) => Number(v);
    return pg.types.getTypeParser(oid, format);
  },
} as pg.CustomTypesConfig;

/** A database refusal that means "out of room" (disk_full, program_limit_exceeded). */
const FULL_CODES = new Set(['53100', '54000']);

function guardedError(e: unknown): unknown {
  const code = (e as { code?: unknown }).code;
  if (typeof code === 'string' && FULL_CODES.has(code))
    return new SyncRefusal('storage-full', 'the server has no room for this; nothing was stored');
  return e;
}

type Client = pg.PoolClient;

/** A statement by its name in sql.ts, prepared by PostgreSQL once per connection. */
/** The head revisions of a pull's page, by headKey, in one round trip (sql.ts pageHeads). */
async function pageHeads(
  c: pg.PoolClient,
  labId: number,
  page: readonly { kind: string; record_id: string; hashes: readonly string[] }[],
): Promise<Map<string, RevisionRow & { kind: string; record_id: string }>> {
  const keys = page.flatMap((r) => r.hashes.map((hash) => [r.kind, r.record_id, hash] as const));
  if (keys.length === 0) return new Map();
  const rows = await run<RevisionRow & { kind: string; record_id: string }>(c, 'pageHeads', [
    keys.map((k) => k[0]),
    keys.map((k) => k[1]),
    keys.map((k) => k[2]),
    labId,
  ]);
  return new Map(rows.map((r) => [headKey(r.kind, r.record_id, r.hash), r]));
}

async function run<R extends pg.QueryResultRow = pg.QueryResultRow>(
  db: Client | pg.Pool,
  name: StatementName,
  values: unknown[] = [],
): Promise<R[]> {
  const result = await db.query<R>({ name, text: forPostgres(name), values });
  return result.rows;
}

async function one<R extends pg.QueryResultRow>(
  db: Client | pg.Pool,
  name: StatementName,
  values: unknown[],
): Promise<R | undefined> {
  return (await run<R>(db, name, values))[0];
}

/**
 * The statement that opens a transaction, with the lab's lock taken in the same round trip when
 * there is one (two statements in one simple query; the lab id is checked to be an integer, so
 * it can be written into the text).
 */
function begin(options: { lab?: number; readOnlySnapshot?: boolean }): string {
  if (options.readOnlySnapshot) return 'BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY';
  if (options.lab === undefined) return 'BEGIN';
  if (!Number.isSafeInteger(options.lab)) throw new Error(`not a lab id: ${options.lab}`);
  return `BEGIN; ${forPostgres('lockLab').replace('$1', String(options.lab))}`;
}

/** Runs the schema steps this database lacks, one process at a time. */
async function migrate(pool: pg.Pool): Promise<void> {
  const client = await pool.connect();
  client.on('error', () => {});
  try {
    await client.query('BEGIN');
    // Servers started together on an empty database: the first makes the tables, the others wait.
    await client.query('SELECT pg_advisory_xact_lock(1919, 0)');
    const exists = await client.query(
      "SELECT 1 FROM pg_catalog.pg_tables WHERE schemaname = current_schema() AND tablename = 'rivalplate_schema'",
    );
    let version = 0;
    if (exists.rowCount)
      version = Number(
        (await client.query('SELECT version FROM rivalplate_schema')).rows[0].version,
      );
    if (version > SCHEMA_VERSION)
      throw new Error(
        `the database was written by a newer server (schema ${version}, this one knows ${SCHEMA_VERSION})`,
      );
    for (const step of POSTGRES_MIGRATIONS.slice(version)) await client.query(step);
    if (version < SCHEMA_VERSION)
      await client.query('UPDATE rivalplate_schema SET version = $1', [SCHEMA_VERSION]);
    await client.query('COMMIT');
  } catch (e) {
    await client.query('ROLLBACK').catch(() => {});
    throw e;
  } finally {
    client.release();
  }
}

/** Where a postgres:// URL points, without its password, for messages and logs. */
export function describeUrl(url: string): string {
  try {
    const u = new URL(url);
    u.password = '';
    return u.toString();
  } catch {
    return 'postgres://…';
  }
}

/** Refuses `bytes` more for a lab holding `held` bytes in unfinished uploads besides its own. */
function checkFits(lab: LabRow, held: number, bytes: number): void {
  if (lab.max_bytes !== null && lab.used_bytes + held + bytes > lab.max_bytes)
    throw new SyncRefusal(
      'storage-full',
      `lab "${lab.name}" holds ${mb(lab.used_bytes + held)} of the ${mb(lab.max_bytes)} it may use on this server, and this needs ${mb(bytes)}: nothing was stored`,
    );
}

const recordKey = (kind: string, id: string) => `${kind}\u0000${id}`;
const headKey = (kind: string, id: string, hash: string) => `${recordKey(kind, id)}\u0000${hash}`;

/** What a push knows of the records it touches, kept up to date as its changes apply. */
interface PushState {
  /** Heads by recordKey. */
  heads: Map<string, string[]>;
  /** `recordKey NUL hash` of the pushed revisions stored already. */
  stored: Set<string>;
  /** Revisions kept by recordKey. */
  kept: Map<string, number>;
}

async function pushState(c: Client, labId: number, changes: HashedChange[]): Promise<PushState> {
  const touched = [
    ...new Map(changes.map(({ change: ch }) => [recordKey(ch.kind, ch.id), ch])).values(),
  ];
  const state: PushState = { heads: new Map(), stored: new Set(), kept: new Map() };
  const rows = await run<{
    what: 'record' | 'revision';
    kind: string;
    record_id: string;
    heads: string;
    hash: string;
    n: number;
  }>(c, 'pushReads', [
    touched.map((ch) => ch.kind),
    touched.map((ch) => ch.id),
    labId,
    changes.map((x) => x.change.kind),
    changes.map((x) => x.change.id),
    changes.map((x) => x.hash),
    labId,
  ]);
  for (const r of rows) {
    const k = recordKey(r.kind, r.record_id);
    if (r.what === 'revision') state.stored.add(`${k}\u0000${r.hash}`);
    else {
      state.heads.set(k, JSON.parse(r.heads));
      state.kept.set(k, r.n);
    }
  }
  return state;
}

/** New revisions of a push, one array per column, written in one statement. */
class PendingRevisions {
  private columns: unknown[][] = [[], [], [], [], [], [], [], []];

  constructor(
    private readonly labId: number,
    private readonly device: string,
    private readonly receivedAt: string,
  ) {}

  add(change: HashedChange['change'], hash: string, body: string | null, heads: string[]): void {
    const row = [
      change.kind,
      change.id,
      hash,
      change.revision,
      change.updatedAt,
      change.deleted ? 1 : 0,
      body,
      JSON.stringify(heads),
    ];
    row.forEach((value, i) => {
      this.columns[i]!.push(value);
    });
  }

  /** Writes what was added since the last write (nothing to do when nothing was). */
  async write(c: Client): Promise<void> {
    if (this.columns[0]!.length === 0) return;
    const [labId, device, at] = [this.labId, this.device, this.receivedAt];
    await run(c, 'insertRevisionsAndHeads', [...this.columns, labId, device, at, labId]);
    this.columns = this.columns.map(() => []);
  }
}

export async function openPostgresStore(options: PostgresOptions): Promise<SyncStore> {
  const pool = new pg.Pool({
    connectionString: options.url,
    ...(options.password !== undefined ? { password: options.password } : {}),
    max: options.poolSize ?? 10,
    types,
    // A database that does not answer is reported, not waited on for ever.
    connectionTimeoutMillis: 10_000,
  });
  // A connection the database drops while idle (a restart) is only replaced, never fatal.
  pool.on('error', () => {});
  try {
    await migrate(pool);
  } catch (e) {
    await pool.end();
    throw e;
  }

  const now = () => new Date().toISOString();

  /**
   * One transaction on one connection: committed when `work` resolves, rolled back when it
   * throws. `lab`: holds that lab's write lock to the end (see the top of this file).
   */
  async function tx<T>(
    work: (c: Client) => Promise<T>,
    options: { lab?: number; readOnlySnapshot?: boolean } = {},
  ): Promise<T> {
    const client = await pool.connect();
    let broken: Error | undefined;
    // A connection the database drops while it is taken (a restart) fails the query in flight;
    // the event it also emits must not end the process.
    const dropped = (e: Error) => {
      broken = e;
    };
    client.on('error', dropped);
    try {
      await client.query(begin(options));
      const result = await work(client);
      await client.query('COMMIT');
      return result;
    } catch (e) {
      await client.query('ROLLBACK').catch((r: Error) => {
        broken = r; // the connection is gone: it is not given back to the pool
      });
      throw guardedError(e);
    } finally {
      client.off('error', dropped);
      client.release(broken);
    }
  }

  async function mustFit(c: Client, labId: number, bytes: number): Promise<void> {
    const lab = (await one<LabRow>(c, 'labById', [labId]))!;
    const open = await run<{ bytes: number; received: number }>(c, 'openUploads', [labId]);
    checkFits(
      lab,
      open.reduce((sum, u) => sum + u.bytes - u.received, 0),
      bytes,
    );
  }

  const charge = (c: Client, labId: number, bytes: number) => run(c, 'addUsed', [bytes, labId]);

  /** As sqlite-store.ts's settleWhole: inside the caller's transaction, under the lab's lock. */
  async function settleWhole(c: Client, labId: number, row: UploadRow): Promise<Upload> {
    if (row.complete === 1 || row.received < row.bytes) return uploadFromRow(row);
    const hash = createHash('sha256');
    let start = 0;
    for (;;) {
      const chunk = await one<{ data: Buffer }>(c, 'chunkAt', [labId, row.photo_id, start]);
      if (!chunk) break;
      hash.update(chunk.data);
      start += chunk.data.length;
    }
    const verified = hash.digest('hex') === row.sha256;
    if (!verified) {
      await run(c, 'dropChunks', [labId, row.photo_id]);
      await charge(c, labId, -row.received);
    }
    await run(c, 'setReceived', [verified ? row.bytes : 0, verified ? 1 : 0, labId, row.photo_id]);
    return {
      ...uploadFromRow((await one<UploadRow>(c, 'upload', [labId, row.photo_id]))!),
      ...(verified ? {} : { mismatch: true }),
    };
  }

  /**
   * The same steps as sqlite-store.ts's pushAll, in five round trips whatever the push's size:
   * what they read of the touched records is fetched up front (pushState) and kept up to date
   * here as changes apply; the new revisions are written together (PendingRevisions), before a
   * record's oldest revisions are trimmed and at the end; the lab is charged and its cap checked
   * in one statement.
   */
  async function pushAll(
    c: Client,
    labId: number,
    device: string,
    changes: HashedChange[],
  ): Promise<PushResponse> {
    const state = await pushState(c, labId, changes);
    const pending = new PendingRevisions(labId, device, now());
    const answer: PushResponse = { accepted: [], conflicts: [] };
    let added = 0;
    for (const { change, hash } of changes) {
      const { kind, id, revision } = change;
      const k = recordKey(kind, id);
      const current = state.heads.get(k) ?? [];
      const repeat = state.stored.has(`${k}\u0000${hash}`);
      let heads = current;
      if (!repeat) {
        const body = change.body === null ? null : JSON.stringify(change.body);
        heads = headsAfter(change, current, change.replaces, hash);
        pending.add(change, hash, body, heads);
        state.heads.set(k, heads);
        state.stored.add(`${k}\u0000${hash}`);
        added += storedBytes(body, device, id);
        const count = (state.kept.get(k) ?? 0) + 1;
        state.kept.set(k, count);
        if (count > REVISIONS_KEPT) {
          await pending.write(c);
          added -= await trimRecord(c, labId, change, heads, state);
        }
      }
      const receipt: Receipt = { kind, id, revision, hash, repeat };
      if (heads.length > 1 && heads.includes(hash)) answer.conflicts.push(receipt);
      else answer.accepted.push(receipt);
    }
    await pending.write(c);
    const lab = (await one<LabRow & { held: number }>(c, 'chargeLab', [added, labId]))!;
    checkFits({ ...lab, used_bytes: lab.used_bytes - added }, lab.held, added);
    return answer;
  }

  /** Drops a record's revisions beyond the newest REVISIONS_KEPT, its heads spared: bytes freed. */
  async function trimRecord(
    c: Client,
    labId: number,
    { kind, id }: { kind: string; id: string },
    heads: readonly string[],
    state: PushState,
  ): Promise<number> {
    const k = recordKey(kind, id);
    let freed = 0;
    const old = await run<{ seq: number; hash: string; body: string | null; device: string }>(
      c,
      'beyondKept',
      [labId, kind, id, REVISIONS_KEPT],
    );
    for (const o of old) {
      if (heads.includes(o.hash)) continue;
      await run(c, 'dropRevision', [o.seq]);
      state.stored.delete(`${k}\u0000${o.hash}`);
      state.kept.set(k, state.kept.get(k)! - 1);
      freed += storedBytes(o.body, o.device, id);
    }
    return freed;
  }

  /** The cursor's point in this lab's history must be a revision this database holds. */
  async function checkHistory(c: Client, labId: number, since: Cursor): Promise<void> {
    if (since.seq === 0) return;
    const at = await one<{ hash: string }>(c, 'revisionAt', [labId, since.seq]);
    if (!at || (since.mark !== null && !at.hash.startsWith(since.mark)))
      throw new SyncRefusal(
        'cursor-unknown',
        'this cursor is from another copy of the server database (it was restored or replaced): pull from the start and push again what the server lacks',
      );
  }

  return {
    async addLab(name: string, settings: LabSettings) {
      try {
        const [row] = await run<{ id: number }>(pool, 'insertLab', [
          name,
          settings.photosEnabled ? 1 : 0,
          settings.photoMaxBytes,
          settings.maxBytes ?? null,
          now(),
        ]);
        return labFromRow((await one<LabRow>(pool, 'labById', [row!.id]))!);
      } catch (e) {
        if ((e as { code?: unknown }).code === '23505')
          throw new SyncRefusal('invalid-request', `a lab named "${name}" exists already`);
        throw guardedError(e);
      }
    },
    async findLab(name) {
      const row = await one<LabRow>(pool, 'labByName', [name]);
      return row && labFromRow(row);
    },
    async addToken(labId, hash, label) {
      try {
        await run(pool, 'insertToken', [hash, labId, now(), label ?? null]);
      } catch (e) {
        throw guardedError(e);
      }
      return tokenFromRow((await one<TokenRow>(pool, 'token', [hash]))!);
    },
    async listTokens(labId) {
      return (await run<TokenRow>(pool, 'tokensOfLab', [labId])).map(tokenFromRow);
    },
    async revokeToken(labId, id): Promise<TokenInfo[]> {
      return tx(async (c) => {
        const matching = (await run<TokenRow>(c, 'tokensOfLab', [labId])).filter(
          (r) => tokenId(r.hash) === id,
        );
        const at = now();
        for (const r of matching) await run(c, 'revokeToken', [at, r.hash]);
        return matching.map(tokenFromRow);
      });
    },
    async tokenAccess(hash): Promise<TokenAccess | undefined> {
      const row = await one<LabRow & { revoked_at: string | null; last_used_on: string | null }>(
        pool,
        'labByToken',
        [hash],
      );
      if (!row) return undefined;
      const today = now().slice(0, 10);
      // A courtesy to the operator, at most once a day: a failure here never refuses the request.
      if (row.revoked_at === null && row.last_used_on !== today)
        await run(pool, 'noteTokenUse', [today, hash]).catch(() => {});
      return { lab: labFromRow(row), revokedAt: row.revoked_at };
    },
    async push(labId, device, changes: HashedChange[]) {
      return tx((c) => pushAll(c, labId, device, changes), { lab: labId });
    },
    async pull(labId, since, limit, maxBytes) {
      // One snapshot, so the records, their heads and the cursor are from the same moment.
      return tx(
        async (c): Promise<PullResponse> => {
          await checkHistory(c, labId, since);
          const rows = await run<{
            kind: string;
            record_id: string;
            last_seq: number;
            heads: string;
          }>(c, 'changedSince', [labId, since.seq, limit + 1]);
          const page = rows
            .slice(0, limit)
            .map((r) => ({ ...r, hashes: JSON.parse(r.heads) as string[] }));
          const headRows = await pageHeads(c, labId, page);
          const records: PulledRecord[] = [];
          let bytes = PAGE_OVERHEAD;
          let last = since.seq;
          for (const r of page) {
            const record: PulledRecord = {
              kind: r.kind as PulledRecord['kind'],
              id: r.record_id,
              heads: r.hashes.map((h) =>
                revisionFromRow(headRows.get(headKey(r.kind, r.record_id, h))!),
              ),
            };
            bytes += Buffer.byteLength(JSON.stringify(record)) + 1;
            if (records.length > 0 && bytes > maxBytes) break;
            records.push(record);
            last = r.last_seq;
          }
          const mark =
            last === 0
              ? null
              : (await one<{ hash: string }>(c, 'revisionAt', [labId, last]))!.hash.slice(0, 16);
          return {
            records,
            cursor: formatCursor({ seq: last, mark }),
            more: rows.length > records.length,
          };
        },
        { readOnlySnapshot: true },
      );
    },
    async beginUpload(labId, request: PhotoUploadRequest) {
      return tx(
        async (c) => {
          const row = await one<UploadRow>(c, 'upload', [labId, request.photoId]);
          if (row) {
            if (row.sha256 !== request.sha256 || row.bytes !== request.bytes)
              throw new SyncRefusal(
                'upload-mismatch',
                `photo ${request.photoId} was announced with other bytes; a photo id names one photo`,
              );
            await run(c, 'touchUpload', [now(), labId, request.photoId]);
            return settleWhole(c, labId, row);
          }
          const open = await run<{
            photo_id: string;
            bytes: number;
            received: number;
            touched_at: string | null;
          }>(c, 'openUploads', [labId]);
          if (open.length >= SYNC_LIMITS.openUploads) {
            const oldest = open[0]!;
            const touched = oldest.touched_at === null ? 0 : Date.parse(oldest.touched_at);
            if (Date.now() - touched < ABANDONED_MS)
              throw new SyncRefusal(
                'too-many-uploads',
                `${open.length} photo uploads of this lab are unfinished; finish them before starting another`,
              );
            await run(c, 'dropChunks', [labId, oldest.photo_id]);
            await run(c, 'dropUpload', [labId, oldest.photo_id]);
            await charge(c, labId, -oldest.received);
          }
          await mustFit(c, labId, request.bytes);
          await run(c, 'insertUpload', [
            labId,
            request.photoId,
            request.plateId,
            request.bytes,
            request.type,
            request.sha256,
          ]);
          await run(c, 'touchUpload', [now(), labId, request.photoId]);
          return uploadFromRow((await one<UploadRow>(c, 'upload', [labId, request.photoId]))!);
        },
        { lab: labId },
      );
    },
    async upload(labId, photoId) {
      return tx(
        async (c) => {
          const row = await one<UploadRow>(c, 'upload', [labId, photoId]);
          return row && settleWhole(c, labId, row);
        },
        { lab: labId },
      );
    },
    async appendChunk(labId, photoId, offset, bytes) {
      return tx(
        async (c) => {
          const row = await one<UploadRow>(c, 'upload', [labId, photoId]);
          if (!row)
            throw new SyncRefusal('not-found', `no upload was started for photo ${photoId}`);
          if (row.complete === 1 || offset !== row.received)
            throw new SyncRefusal(
              'wrong-offset',
              `photo ${photoId} has ${row.received} of ${row.bytes} bytes; send the chunk at ${row.received}`,
            );
          if (offset + bytes.length > row.bytes)
            throw new SyncRefusal(
              'too-large',
              `chunk ends at byte ${offset + bytes.length}, past the announced ${row.bytes} bytes of photo ${photoId}`,
            );
          await run(c, 'insertChunk', [labId, photoId, offset, bytes]);
          await run(c, 'setReceived', [offset + bytes.length, 0, labId, photoId]);
          await run(c, 'touchUpload', [now(), labId, photoId]);
          await charge(c, labId, bytes.length);
          return settleWhole(c, labId, { ...row, received: offset + bytes.length });
        },
        { lab: labId },
      );
    },
    async *photoChunks(labId, photoId) {
      // One chunk per query by its offset: a photo is never held whole in memory, and no
      // connection stays taken while the answer is being sent.
      let start = 0;
      for (;;) {
        const chunk = await one<{ data: Buffer }>(pool, 'chunkAt', [labId, photoId, start]);
        if (!chunk) return;
        yield chunk.data;
        start += chunk.data.length;
      }
    },
    async close() {
      await pool.end();
    },
  };
}
