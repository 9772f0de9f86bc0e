/**
 * The SQLite engine behind SyncStore: one database file, opened with better-sqlite3. Its calls
 * are synchronous, which makes each transaction run start to end without another request
 * interleaving; the async interface is kept for engines that cannot do that.
 */
import { createHash } from 'node:crypto';
import Database from 'better-sqlite3';
import {
  type Cursor,
  formatCursor,
  type PhotoUploadRequest,
  type PulledRecord,
  type PullResponse,
  type PushResponse,
  type Receipt,
  type Revision,
  SYNC_LIMITS,
} from '../../schema/sync-protocol.ts';
import { headsAfter } from '../heads.ts';
import { SyncRefusal } from '../refusal.ts';
import { tokenId } from '../tokens.ts';
import type {
  HashedChange,
  Lab,
  LabSettings,
  SyncStore,
  TokenAccess,
  TokenInfo,
  Upload,
} from './sync-store.ts';
import { REVISIONS_KEPT } from './sync-store.ts';

/** The tables of the first version; later versions change them by the steps in MIGRATIONS. */
const TABLES = `
CREATE TABLE labs (
  id INTEGER PRIMARY KEY,
  name TEXT NOT NULL UNIQUE,
  photos_enabled INTEGER NOT NULL,
  photo_max_bytes INTEGER NOT NULL,
  created_at TEXT NOT NULL
);
CREATE TABLE tokens (
  hash TEXT PRIMARY KEY,
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  created_at TEXT NOT NULL
);
-- Every revision ever pushed; seq orders them for pulls.
CREATE TABLE revisions (
  seq INTEGER PRIMARY KEY AUTOINCREMENT,
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  kind TEXT NOT NULL,
  record_id TEXT NOT NULL,
  hash TEXT NOT NULL,
  revision INTEGER NOT NULL,
  updated_at TEXT NOT NULL,
  deleted INTEGER NOT NULL,
  body TEXT,
  device TEXT NOT NULL,
  received_at TEXT NOT NULL,
  UNIQUE (lab_id, kind, record_id, hash)
);
-- One row per record: its current heads (a JSON list of hashes) and the seq of its last change.
CREATE TABLE records (
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  kind TEXT NOT NULL,
  record_id TEXT NOT NULL,
  last_seq INTEGER NOT NULL,
  heads TEXT NOT NULL,
  PRIMARY KEY (lab_id, kind, record_id)
);
CREATE INDEX records_by_seq ON records (lab_id, last_seq);
CREATE TABLE uploads (
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  photo_id TEXT NOT NULL,
  plate_id TEXT NOT NULL,
  bytes INTEGER NOT NULL,
  type TEXT NOT NULL,
  sha256 TEXT NOT NULL,
  received INTEGER NOT NULL,
  complete INTEGER NOT NULL,
  PRIMARY KEY (lab_id, photo_id)
);
CREATE TABLE chunks (
  lab_id INTEGER NOT NULL,
  photo_id TEXT NOT NULL,
  start INTEGER NOT NULL,
  data BLOB NOT NULL,
  PRIMARY KEY (lab_id, photo_id, start)
);
`;

/**
 * Step n brings a database from schema version n to n + 1 (user_version). A new file runs them
 * all, so the path an existing file takes is the one every new file takes too. Steps are only
 * ever appended: a released step is part of files in the field.
 */
const MIGRATIONS = [
  TABLES,
  // Tokens get a label, the day of their last use and a revocation time; existing tokens keep
  // working, unlabelled and never revoked.
  `ALTER TABLE tokens ADD COLUMN label TEXT;
   ALTER TABLE tokens ADD COLUMN last_used_on TEXT;
   ALTER TABLE tokens ADD COLUMN revoked_at TEXT;`,
  // Labs get a storage cap of their own (none for existing labs) and a count of the bytes they
  // hold, reckoned as STORED_BYTES reckons them; uploads note when they were last touched, so
  // one abandoned long ago can make room for a new one.
  `ALTER TABLE labs ADD COLUMN max_bytes INTEGER;
   ALTER TABLE labs ADD COLUMN used_bytes INTEGER NOT NULL DEFAULT 0;
   ALTER TABLE uploads ADD COLUMN touched_at TEXT;
   UPDATE labs SET used_bytes =
     coalesce((SELECT sum(length(CAST(coalesce(body, '') AS BLOB)) + length(CAST(device AS BLOB))
                          + length(CAST(record_id AS BLOB)) + 100)
               FROM revisions WHERE revisions.lab_id = labs.id), 0)
     + coalesce((SELECT sum(length(data)) FROM chunks WHERE chunks.lab_id = labs.id), 0);`,
];

/**
 * The bytes a stored revision counts against its lab: its body, device and id as UTF-8, and a
 * fixed part for the hash, times and row (the migration above reckons the same in SQL).
 */
function storedBytes(body: string | null, device: string, id: string): number {
  return Buffer.byteLength(body ?? '') + Buffer.byteLength(device) + Buffer.byteLength(id) + 100;
}

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** An unfinished upload untouched this long may be dropped to make room for a new one. */
const ABANDONED_MS = 24 * 60 * 60 * 1000;

/** A file from a newer server than this one is refused on open. */
const SCHEMA_VERSION = MIGRATIONS.length;

interface LabRow {
  id: number;
  name: string;
  photos_enabled: number;
  photo_max_bytes: number;
  max_bytes: number | null;
  used_bytes: number;
}

interface TokenRow {
  hash: string;
  label: string | null;
  created_at: string;
  last_used_on: string | null;
  revoked_at: string | null;
}

interface RevisionRow {
  hash: string;
  revision: number;
  updated_at: string;
  deleted: number;
  body: string | null;
  device: string;
}

interface UploadRow {
  photo_id: string;
  plate_id: string;
  bytes: number;
  type: string;
  sha256: string;
  received: number;
  complete: number;
}

export interface SqliteOptions {
  file: string;
  /** Caps the database file; a write past it is refused as `storage-full`, not half-done. */
  maxBytes?: number;
}

const labFromRow = (r: LabRow): Lab => ({
  id: r.id,
  name: r.name,
  photosEnabled: r.photos_enabled === 1,
  photoMaxBytes: r.photo_max_bytes,
  maxBytes: r.max_bytes,
});

const tokenFromRow = (r: TokenRow): TokenInfo => ({
  id: tokenId(r.hash),
  label: r.label,
  createdAt: r.created_at,
  lastUsedOn: r.last_used_on,
  revokedAt: r.revoked_at,
});

const uploadFromRow = (r: UploadRow): Upload => ({
  photoId: r.photo_id,
  plateId: r.plate_id,
  bytes: r.bytes,
  type: r.type,
  sha256: r.sha256,
  received: r.received,
  complete: r.complete === 1,
});

const revisionFromRow = (r: RevisionRow): Revision => ({
  hash: r.hash,
  revision: r.revision,
  updatedAt: r.updated_at,
  deleted: r.deleted === 1,
  body: r.body === null ? null : JSON.parse(r.body),
  device: r.device,
});

function migrate(db: Database.Database): void {
  // IMMEDIATE takes the write lock before the version is read, so the command line and a server
  // opening an old file at the same moment do not both run a step.
  db.transaction(() => {
    const version = db.pragma('user_version', { simple: true }) as number;
    if (version > SCHEMA_VERSION)
      throw new Error(
        `the database was written by a newer server (schema ${version}, this one knows ${SCHEMA_VERSION})`,
      );
    if (version === SCHEMA_VERSION) return;
    for (const step of MIGRATIONS.slice(version)) db.exec(step);
    db.pragma(`user_version = ${SCHEMA_VERSION}`);
  }).immediate();
}

/** A full disk or the size cap becomes the protocol's `storage-full`; the transaction rolled back. */
function guarded<T>(work: () => T): T {
  try {
    return work();
  } catch (e) {
    const code = (e as { code?: unknown }).code;
    if (code === 'SQLITE_FULL')
      throw new SyncRefusal('storage-full', 'the server has no room for this; nothing was stored');
    throw e;
  }
}

export function openSqliteStore(options: SqliteOptions): SyncStore {
  const db = new Database(options.file);
  // WAL lets the command line add labs and tokens while the server runs; FULL sync makes a
  // committed push survive a power cut, not only a killed process.
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = FULL');
  db.pragma('foreign_keys = ON');
  db.pragma('busy_timeout = 5000');
  try {
    migrate(db);
  } catch (e) {
    // A file this server cannot use (one from a newer server) is not held open by a failed start.
    db.close();
    throw e;
  }
  if (options.maxBytes !== undefined) {
    const pageSize = db.pragma('page_size', { simple: true }) as number;
    db.pragma(`max_page_count = ${Math.max(1, Math.floor(options.maxBytes / pageSize))}`);
  }

  const q = {
    labByName: db.prepare<[string], LabRow>('SELECT * FROM labs WHERE name = ?'),
    labById: db.prepare<[number], LabRow>('SELECT * FROM labs WHERE id = ?'),
    insertLab: db.prepare(
      'INSERT INTO labs (name, photos_enabled, photo_max_bytes, max_bytes, created_at) VALUES (?, ?, ?, ?, ?)',
    ),
    addUsed: db.prepare('UPDATE labs SET used_bytes = used_bytes + ? WHERE id = ?'),
    openUploads: db.prepare<
      [number],
      { photo_id: string; bytes: number; received: number; touched_at: string | null }
    >(
      'SELECT photo_id, bytes, received, touched_at FROM uploads WHERE lab_id = ? AND complete = 0 ORDER BY touched_at',
    ),
    dropUpload: db.prepare('DELETE FROM uploads WHERE lab_id = ? AND photo_id = ?'),
    touchUpload: db.prepare('UPDATE uploads SET touched_at = ? WHERE lab_id = ? AND photo_id = ?'),
    insertToken: db.prepare(
      'INSERT INTO tokens (hash, lab_id, created_at, label) VALUES (?, ?, ?, ?)',
    ),
    token: db.prepare<[string], TokenRow>('SELECT * FROM tokens WHERE hash = ?'),
    tokensOfLab: db.prepare<[number], TokenRow>(
      'SELECT * FROM tokens WHERE lab_id = ? ORDER BY created_at, rowid',
    ),
    labByToken: db.prepare<
      [string],
      LabRow & { revoked_at: string | null; last_used_on: string | null }
    >(
      `SELECT labs.*, tokens.revoked_at, tokens.last_used_on
       FROM tokens JOIN labs ON labs.id = tokens.lab_id WHERE tokens.hash = ?`,
    ),
    noteTokenUse: db.prepare('UPDATE tokens SET last_used_on = ? WHERE hash = ?'),
    revokeToken: db.prepare(
      'UPDATE tokens SET revoked_at = ? WHERE hash = ? AND revoked_at IS NULL',
    ),
    /** A record's revisions past the newest REVISIONS_KEPT, as the rows to drop. */
    beyondKept: db.prepare<
      [number, string, string, number],
      { seq: number; hash: string; body: string | null; device: string }
    >(
      `SELECT seq, hash, body, device FROM revisions WHERE lab_id = ? AND kind = ? AND record_id = ?
       ORDER BY seq DESC LIMIT -1 OFFSET ?`,
    ),
    dropRevision: db.prepare('DELETE FROM revisions WHERE seq = ?'),
    revisionExists: db.prepare<[number, string, string, string], { seq: number }>(
      'SELECT seq FROM revisions WHERE lab_id = ? AND kind = ? AND record_id = ? AND hash = ?',
    ),
    insertRevision: db.prepare(
      `INSERT INTO revisions (lab_id, kind, record_id, hash, revision, updated_at, deleted, body, device, received_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    ),
    recordHeads: db.prepare<[number, string, string], { heads: string }>(
      'SELECT heads FROM records WHERE lab_id = ? AND kind = ? AND record_id = ?',
    ),
    upsertRecord: db.prepare(
      `INSERT INTO records (lab_id, kind, record_id, last_seq, heads) VALUES (?, ?, ?, ?, ?)
       ON CONFLICT (lab_id, kind, record_id) DO UPDATE SET last_seq = excluded.last_seq, heads = excluded.heads`,
    ),
    changedSince: db.prepare<
      [number, number, number],
      { kind: string; record_id: string; last_seq: number; heads: string }
    >('SELECT * FROM records WHERE lab_id = ? AND last_seq > ? ORDER BY last_seq LIMIT ?'),
    revisionByHash: db.prepare<[number, string, string, string], RevisionRow>(
      'SELECT * FROM revisions WHERE lab_id = ? AND kind = ? AND record_id = ? AND hash = ?',
    ),
    upload: db.prepare<[number, string], UploadRow>(
      'SELECT * FROM uploads WHERE lab_id = ? AND photo_id = ?',
    ),
    insertUpload: db.prepare(
      `INSERT INTO uploads (lab_id, photo_id, plate_id, bytes, type, sha256, received, complete)
       VALUES (?, ?, ?, ?, ?, ?, 0, 0)`,
    ),
    insertChunk: db.prepare(
      'INSERT INTO chunks (lab_id, photo_id, start, data) VALUES (?, ?, ?, ?)',
    ),
    setReceived: db.prepare(
      'UPDATE uploads SET received = ?, complete = ? WHERE lab_id = ? AND photo_id = ?',
    ),
    chunks: db.prepare<[number, string], { data: Buffer }>(
      'SELECT data FROM chunks WHERE lab_id = ? AND photo_id = ? ORDER BY start',
    ),
    chunkAt: db.prepare<[number, string, number], { data: Buffer }>(
      'SELECT data FROM chunks WHERE lab_id = ? AND photo_id = ? AND start = ?',
    ),
    revisionAt: db.prepare<[number, number], { hash: string }>(
      'SELECT hash FROM revisions WHERE lab_id = ? AND seq = ?',
    ),
    dropChunks: db.prepare('DELETE FROM chunks WHERE lab_id = ? AND photo_id = ?'),
  };

  const now = () => new Date().toISOString();

  /**
   * Written at most once a day per token, so most requests only read. The day is a courtesy to
   * the operator: a full or locked database must not refuse the request over it.
   */
  const noteTokenUse = (hash: string, day: string) => {
    try {
      q.noteTokenUse.run(day, hash);
    } catch (e) {
      if (!String((e as { code?: unknown }).code).startsWith('SQLITE_')) throw e;
    }
  };

  const revokeAll = db.transaction((labId: number, id: string): TokenInfo[] => {
    const matching = q.tokensOfLab.all(labId).filter((r) => tokenId(r.hash) === id);
    const at = now();
    for (const r of matching) q.revokeToken.run(at, r.hash);
    return matching.map(tokenFromRow);
  });

  /**
   * Refuses, inside the caller's transaction, `bytes` more for a lab past its cap. Bytes announced
   * by its unfinished uploads and not yet received are held for them, as if already used.
   */
  function mustFit(labId: number, bytes: number): void {
    const lab = q.labById.get(labId)!;
    const held = q.openUploads.all(labId).reduce((sum, u) => sum + u.bytes - u.received, 0);
    if (lab.max_bytes !== null && lab.used_bytes + held + bytes > lab.max_bytes)
      throw new SyncRefusal(
        'storage-full',
        `lab "${lab.name}" holds ${mb(lab.used_bytes + held)} of the ${mb(lab.max_bytes)} it may use on this server, and this needs ${mb(bytes)}: nothing was stored`,
      );
  }

  /** Counts bytes stored (or dropped, when negative) against the lab. */
  const charge = (labId: number, bytes: number) => q.addUsed.run(bytes, labId);

  const pushAll = db.transaction((labId: number, device: string, changes: HashedChange[]) => {
    const answer: PushResponse = { accepted: [], conflicts: [] };
    let added = 0;
    for (const { change, hash } of changes) {
      const { kind, id, revision } = change;
      const row = q.recordHeads.get(labId, kind, id);
      const current: string[] = row ? JSON.parse(row.heads) : [];
      const repeat = q.revisionExists.get(labId, kind, id, hash) !== undefined;
      let heads = current;
      if (!repeat) {
        const body = change.body === null ? null : JSON.stringify(change.body);
        const info = q.insertRevision.run(
          labId,
          kind,
          id,
          hash,
          revision,
          change.updatedAt,
          change.deleted ? 1 : 0,
          body,
          device,
          now(),
        );
        added += storedBytes(body, device, id);
        heads = headsAfter(change, current, change.replaces, hash);
        q.upsertRecord.run(labId, kind, id, Number(info.lastInsertRowid), JSON.stringify(heads));
        for (const old of q.beyondKept.all(labId, kind, id, REVISIONS_KEPT)) {
          if (heads.includes(old.hash)) continue;
          q.dropRevision.run(old.seq);
          added -= storedBytes(old.body, old.device, id);
        }
      }
      const receipt: Receipt = { kind, id, revision, hash, repeat };
      // A repeat whose revision was later replaced was accepted back then: say so again.
      if (heads.length > 1 && heads.includes(hash)) answer.conflicts.push(receipt);
      else answer.accepted.push(receipt);
    }
    mustFit(labId, added);
    charge(labId, added);
    return answer;
  });

  /**
   * An upload whose bytes are all in is checked against its SHA-256 here, inside the caller's
   * transaction: marked complete, or its chunks dropped so it starts over. Done in the same
   * transaction as the last chunk, no crash can leave all the bytes in and the photo unfinished;
   * a file an older server left that way is finished by the next request about the photo.
   */
  function settleWhole(labId: number, row: UploadRow): Upload {
    if (row.complete === 1 || row.received < row.bytes) return uploadFromRow(row);
    const hash = createHash('sha256');
    for (const c of q.chunks.iterate(labId, row.photo_id)) hash.update(c.data);
    const verified = hash.digest('hex') === row.sha256;
    if (!verified) {
      q.dropChunks.run(labId, row.photo_id);
      charge(labId, -row.received);
    }
    q.setReceived.run(verified ? row.bytes : 0, verified ? 1 : 0, labId, row.photo_id);
    return {
      ...uploadFromRow(q.upload.get(labId, row.photo_id)!),
      ...(verified ? {} : { mismatch: true }),
    };
  }

  const settled = db.transaction((labId: number, photoId: string): Upload | undefined => {
    const row = q.upload.get(labId, photoId);
    return row && settleWhole(labId, row);
  });

  const appendAll = db.transaction(
    (labId: number, photoId: string, offset: number, bytes: Buffer): Upload => {
      const row = q.upload.get(labId, photoId);
      if (!row) throw new SyncRefusal('not-found', `no upload was started for photo ${photoId}`);
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
      q.insertChunk.run(labId, photoId, offset, bytes);
      q.setReceived.run(offset + bytes.length, 0, labId, photoId);
      q.touchUpload.run(now(), labId, photoId);
      // The announced bytes were held for this upload already: the chunk only turns them into use.
      charge(labId, bytes.length);
      return settleWhole(labId, { ...row, received: offset + bytes.length });
    },
  );

  const begin = db.transaction((labId: number, request: PhotoUploadRequest): Upload => {
    const row = q.upload.get(labId, request.photoId);
    if (row) {
      if (row.sha256 !== request.sha256 || row.bytes !== request.bytes)
        throw new SyncRefusal(
          'upload-mismatch',
          `photo ${request.photoId} was announced with other bytes; a photo id names one photo`,
        );
      q.touchUpload.run(now(), labId, request.photoId);
      return settleWhole(labId, row);
    }
    const open = q.openUploads.all(labId);
    if (open.length >= SYNC_LIMITS.openUploads) {
      // Untouched for a day: its phone has given up on it (a phone resumes within its rounds).
      const oldest = open[0]!;
      const touched = oldest.touched_at === null ? 0 : Date.parse(oldest.touched_at);
      if (Date.now() - touched < ABANDONED_MS)
        throw new SyncRefusal(
          'too-many-uploads',
          `${open.length} photo uploads of this lab are unfinished; finish them before starting another`,
        );
      q.dropChunks.run(labId, oldest.photo_id);
      q.dropUpload.run(labId, oldest.photo_id);
      charge(labId, -oldest.received);
    }
    // The announced bytes are held against the lab's cap before any arrive.
    mustFit(labId, request.bytes);
    q.insertUpload.run(
      labId,
      request.photoId,
      request.plateId,
      request.bytes,
      request.type,
      request.sha256,
    );
    q.touchUpload.run(now(), labId, request.photoId);
    return uploadFromRow(q.upload.get(labId, request.photoId)!);
  });

  /** The cursor's point in this lab's history must be a revision this database holds. */
  function checkHistory(labId: number, since: Cursor): void {
    if (since.seq === 0) return;
    const at = q.revisionAt.get(labId, since.seq);
    if (!at || (since.mark !== null && !at.hash.startsWith(since.mark)))
      throw new SyncRefusal(
        'cursor-unknown',
        'this cursor is from another copy of the server database (it was restored or replaced): pull from the start and push again what the server lacks',
      );
  }

  const cursorAt = (labId: number, seq: number): string =>
    formatCursor({ seq, mark: seq === 0 ? null : q.revisionAt.get(labId, seq)!.hash.slice(0, 16) });

  /**
   * Bytes the answer takes as sent: the page's fixed part plus each record with its comma, all in
   * UTF-8, so device ids and text in any script count at their real size.
   */
  const PAGE_OVERHEAD = Buffer.byteLength(
    JSON.stringify({
      records: [],
      cursor: formatCursor({ seq: 1e15 - 1, mark: 'f'.repeat(16) }),
      more: false,
    }),
  );

  return {
    async addLab(name: string, settings: LabSettings) {
      if (q.labByName.get(name))
        throw new SyncRefusal('invalid-request', `a lab named "${name}" exists already`);
      const info = guarded(() =>
        q.insertLab.run(
          name,
          settings.photosEnabled ? 1 : 0,
          settings.photoMaxBytes,
          settings.maxBytes ?? null,
          now(),
        ),
      );
      return labFromRow(q.labById.get(Number(info.lastInsertRowid))!);
    },
    async findLab(name) {
      const row = q.labByName.get(name);
      return row && labFromRow(row);
    },
    async addToken(labId, hash, label) {
      guarded(() => q.insertToken.run(hash, labId, now(), label ?? null));
      return tokenFromRow(q.token.get(hash)!);
    },
    async listTokens(labId) {
      return q.tokensOfLab.all(labId).map(tokenFromRow);
    },
    async revokeToken(labId, id) {
      return guarded(() => revokeAll(labId, id));
    },
    async tokenAccess(hash): Promise<TokenAccess | undefined> {
      const row = q.labByToken.get(hash);
      if (!row) return undefined;
      const today = now().slice(0, 10);
      if (row.revoked_at === null && row.last_used_on !== today) noteTokenUse(hash, today);
      return { lab: labFromRow(row), revokedAt: row.revoked_at };
    },
    async push(labId, device, changes) {
      return guarded(() => pushAll(labId, device, changes));
    },
    async pull(labId, since, limit, maxBytes) {
      // One read transaction, so the records and their heads are from the same moment.
      return db.transaction((): PullResponse => {
        checkHistory(labId, since);
        const rows = q.changedSince.all(labId, since.seq, limit + 1);
        const records: PulledRecord[] = [];
        let bytes = PAGE_OVERHEAD;
        let last = since.seq;
        for (const r of rows.slice(0, limit)) {
          const record: PulledRecord = {
            kind: r.kind as PulledRecord['kind'],
            id: r.record_id,
            heads: (JSON.parse(r.heads) as string[]).map((h) =>
              revisionFromRow(q.revisionByHash.get(labId, r.kind, r.record_id, h)!),
            ),
          };
          bytes += Buffer.byteLength(JSON.stringify(record)) + 1;
          // Always at least one record, so a record larger than the budget still gets through.
          if (records.length > 0 && bytes > maxBytes) break;
          records.push(record);
          last = r.last_seq;
        }
        return {
          records,
          cursor: cursorAt(labId, last),
          more: rows.length > records.length,
        };
      })();
    },
    async beginUpload(labId, request) {
      return guarded(() => begin(labId, request));
    },
    async upload(labId, photoId) {
      return guarded(() => settled(labId, photoId));
    },
    async appendChunk(labId, photoId, offset, bytes) {
      return guarded(() => appendAll(labId, photoId, offset, bytes));
    },
    async *photoChunks(labId, photoId) {
      // One chunk read at a time by its offset, so a photo is never held whole in memory and no
      // statement stays open between reads while other requests use the connection.
      let start = 0;
      for (;;) {
        const chunk = q.chunkAt.get(labId, photoId, start);
        if (!chunk) return;
        yield chunk.data;
        start += chunk.data.length;
      }
    },
    async close() {
      db.close();
    },
  };
}
