/**
 * The SQLite engine behind SyncStore: one database file, opened with better-sqlite3. Its calls
 * are synchronous, which makes each transaction run start to end without another request
 * interleaving; the async interface is kept for engines that cannot do that. Writes begin
 * IMMEDIATE (the file's write lock is taken before anything is read), so a second process on the
 * same file (the command line, or another server) waits its turn instead of failing on a snapshot
 * that went stale between the read and the write; seqs are then assigned in commit order.
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
import { forSqlite, SQLITE_MIGRATIONS } from './sql.ts';
import type {
  HashedChange,
  LabSettings,
  SyncStore,
  TokenAccess,
  TokenInfo,
  Upload,
} from './sync-store.ts';
import { REVISIONS_KEPT } from './sync-store.ts';

/** A file from a newer server than this one is refused on open. */
const SCHEMA_VERSION = SQLITE_MIGRATIONS.length;

export interface SqliteOptions {
  file: string;
  /** Caps the database file; a write past it is refused as `storage-full`, not half-done. */
  maxBytes?: number;
}

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
    for (const step of SQLITE_MIGRATIONS.slice(version)) db.exec(step);
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
    labByName: db.prepare<[string], LabRow>(forSqlite('labByName')),
    labById: db.prepare<[number], LabRow>(forSqlite('labById')),
    insertLab: db.prepare(forSqlite('insertLab')),
    addUsed: db.prepare(forSqlite('addUsed')),
    openUploads: db.prepare<
      [number],
      { photo_id: string; bytes: number; received: number; touched_at: string | null }
    >(forSqlite('openUploads')),
    dropUpload: db.prepare(forSqlite('dropUpload')),
    touchUpload: db.prepare(forSqlite('touchUpload')),
    insertToken: db.prepare(forSqlite('insertToken')),
    token: db.prepare<[string], TokenRow>(forSqlite('token')),
    tokensOfLab: db.prepare<[number], TokenRow>(forSqlite('tokensOfLab')),
    labByToken: db.prepare<
      [string],
      LabRow & { revoked_at: string | null; last_used_on: string | null }
    >(forSqlite('labByToken')),
    noteTokenUse: db.prepare(forSqlite('noteTokenUse')),
    revokeToken: db.prepare(forSqlite('revokeToken')),
    beyondKept: db.prepare<
      [number, string, string, number],
      { seq: number; hash: string; body: string | null; device: string }
    >(forSqlite('beyondKept')),
    dropRevision: db.prepare(forSqlite('dropRevision')),
    revisionExists: db.prepare<[number, string, string, string], { seq: number }>(
      forSqlite('revisionExists'),
    ),
    insertRevision: db.prepare(forSqlite('insertRevision')),
    recordHeads: db.prepare<[number, string, string], { heads: string }>(forSqlite('recordHeads')),
    upsertRecord: db.prepare(forSqlite('upsertRecord')),
    changedSince: db.prepare<
      [number, number, number],
      { kind: string; record_id: string; last_seq: number; heads: string }
    >(forSqlite('changedSince')),
    revisionByHash: db.prepare<[number, string, string, string], RevisionRow>(
      forSqlite('revisionByHash'),
    ),
    upload: db.prepare<[number, string], UploadRow>(forSqlite('upload')),
    insertUpload: db.prepare(forSqlite('insertUpload')),
    insertChunk: db.prepare(forSqlite('insertChunk')),
    setReceived: db.prepare(forSqlite('setReceived')),
    chunks: db.prepare<[number, string], { data: Buffer }>(forSqlite('chunks')),
    chunkAt: db.prepare<[number, string, number], { data: Buffer }>(forSqlite('chunkAt')),
    revisionAt: db.prepare<[number, number], { hash: string }>(forSqlite('revisionAt')),
    dropChunks: db.prepare(forSqlite('dropChunks')),
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
      return guarded(() => revokeAll.immediate(labId, id));
    },
    async tokenAccess(hash): Promise<TokenAccess | undefined> {
      const row = q.labByToken.get(hash);
      if (!row) return undefined;
      const today = now().slice(0, 10);
      if (row.revoked_at === null && row.last_used_on !== today) noteTokenUse(hash, today);
      return { lab: labFromRow(row), revokedAt: row.revoked_at };
    },
    async push(labId, device, changes) {
      return guarded(() => pushAll.immediate(labId, device, changes));
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
      return guarded(() => begin.immediate(labId, request));
    },
    async upload(labId, photoId) {
      return guarded(() => settled.immediate(labId, photoId));
    },
    async appendChunk(labId, photoId, offset, bytes) {
      return guarded(() => appendAll.immediate(labId, photoId, offset, bytes));
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
