/**
 * The sync protocol between the app and a lab's sync server, written once for both sides: the
 * message types, the checks that parse them from JSON, the limits, and the error codes. The server
 * checks every request with these; the app checks every answer with them.
 *
 * Model: every push of a record makes a *revision*, named by the server with a SHA-256 hash of
 * its content. A record's *heads* are the revisions no later push has replaced. An edit names the
 * heads it was made on top of (`replaces`); if another phone replaced them first, the record ends
 * with two heads, i.e. a conflict, and both edits are kept until a person resolves it by pushing
 * a revision that replaces both.
 */
import {
  bool,
  type Check,
  count,
  idText,
  isoTime,
  list,
  nameText,
  nonEmpty,
  object,
  oneOf,
  SchemaError,
  str,
  TEXT_BYTES,
} from './check.ts';
import { KINDS, RECORD_KINDS } from './kinds.ts';
import { upgradeRecord } from './record-format.ts';
import type { RecordKind, RecordsByKind } from './records.ts';

/** The protocol version in the URL path (`/sync/v1/...`). */
export const SYNC_PROTOCOL = 1;
export const SYNC_BASE_PATH = `/sync/v${SYNC_PROTOCOL}`;

/**
 * Every limit the server keeps to, refused on the way in with a message naming the field. Text is
 * counted in UTF-8 bytes, and must be valid Unicode (no lone UTF-16 surrogates, which have no
 * UTF-8 form): record ids, photo ids and every id a record names at most `idBytes`; the device id
 * and names (experiments, lines, colours) at most `nameBytes`; any other text field at most
 * `textBytes`. Times are UTC in the one form `toISOString` writes.
 */
export const SYNC_LIMITS = {
  /** Changes in one push; a client sends a longer outbox as several pushes. */
  changesPerPush: 200,
  /** Bytes of one push request body. An analysis with its colonies is tens of kilobytes. */
  pushBytes: 8 * 1024 * 1024,
  /** Records in one pull answer. */
  recordsPerPull: 500,
  /**
   * Bytes of one pull answer as sent (UTF-8 JSON, everything counted: bodies, device ids, hashes),
   * so a phone on a poor network gets it whole. A single record larger than this still comes,
   * alone on its page, or it could never be pulled.
   */
  pullBytes: 4 * 1024 * 1024,
  /**
   * Heads one record may have: that many unresolved versions at once. A push that would give a
   * record one more is refused (`too-many-heads`) and stays on the phone; a resolution, which
   * replaces the heads, is always taken.
   */
  headsPerRecord: 64,
  /** Bytes of one photo chunk. */
  chunkBytes: 1024 * 1024,
  /**
   * Unfinished photo uploads one lab may have at once (`too-many-uploads` past it); one untouched
   * for a day is dropped to make room for a new one.
   */
  openUploads: 16,
  /** The largest photo size a lab may be set to take (`add-lab --photo-max-mb`). */
  photoBytes: 100 * 1024 * 1024,
  idBytes: TEXT_BYTES.id,
  nameBytes: TEXT_BYTES.name,
  textBytes: TEXT_BYTES.text,
} as const;

/** Kinds exchanged as records; photos travel as separate chunked uploads. */
export const SYNCED_KINDS: readonly RecordKind[] = RECORD_KINDS.filter((k) => KINDS[k].synced);

/** One local change as the client sends it. A deletion is a tombstone: `deleted` with no body. */
export interface Change<K extends RecordKind = RecordKind> {
  kind: K;
  /** The client-made record id. */
  id: string;
  revision: number;
  updatedAt: string;
  deleted: boolean;
  body: RecordsByKind[K] | null;
  /** Hashes of the server revisions this edit was made on top of; empty for a new record. */
  replaces: string[];
}

export interface PushRequest {
  /** A client-made id of the phone, kept with each revision so a conflict can say whose it is. */
  device: string;
  changes: Change[];
}

/** What became of one pushed change. */
export interface Receipt {
  kind: RecordKind;
  id: string;
  revision: number;
  /** The server's name for the revision: what a later edit of this record `replaces`. */
  hash: string;
  /** The server had this exact revision already (a retried push). */
  repeat: boolean;
}

/**
 * `accepted`: the revision is now the record's only head. `conflicts`: the revision is stored but
 * the record has other heads too; the next pull brings them all.
 */
export interface PushResponse {
  accepted: Receipt[];
  conflicts: Receipt[];
}

/** A stored revision as a pull returns it. */
export interface Revision {
  hash: string;
  revision: number;
  updatedAt: string;
  deleted: boolean;
  /** The record as pushed, unchecked: the app passes it through the restore gate. */
  body: unknown;
  device: string;
}

/** A record changed since the cursor, with all its heads: more than one is a conflict. */
export interface PulledRecord {
  kind: RecordKind;
  id: string;
  heads: Revision[];
}

export interface PullResponse {
  records: PulledRecord[];
  /** Pass as `since` to the next pull. Opaque to the client. */
  cursor: string;
  /** More records wait past this cursor. */
  more: boolean;
}

/** `GET /sync/v1/lab`: the lab this token belongs to and its settings. */
export interface LabInfo {
  lab: string;
  protocol: number;
  photos: { enabled: boolean; maxBytes: number };
}

/** `POST /sync/v1/photos`: announce a photo before sending its bytes in chunks. */
export interface PhotoUploadRequest {
  photoId: string;
  plateId: string;
  bytes: number;
  type: string;
  /** SHA-256 of the whole photo, lowercase hex: the server checks it when the last chunk lands. */
  sha256: string;
}

/** How far an upload has come; a client resumes by sending the chunk at `received`. */
export interface PhotoUploadState {
  photoId: string;
  bytes: number;
  received: number;
  complete: boolean;
}

/** Every refusal, as a tagged union carried in the error body; the HTTP status goes with it. */
export const SYNC_ERRORS = {
  'no-token': 401,
  'bad-token': 401,
  'invalid-request': 400,
  'not-found': 404,
  'wrong-offset': 409,
  'upload-mismatch': 409,
  /** The record has `SYNC_LIMITS.headsPerRecord` unresolved versions: resolve them first. */
  'too-many-heads': 409,
  /**
   * The pull's cursor is not a point in this database's history: the database was restored from
   * a copy or replaced. The phone pulls from the start and pushes again what the server lacks.
   */
  'cursor-unknown': 410,
  /** The lab has `SYNC_LIMITS.openUploads` unfinished photo uploads: finish one first. */
  'too-many-uploads': 429,
  'photos-off': 403,
  'too-large': 413,
  'unsupported-type': 415,
  'version-too-old': 426,
  'server-fault': 500,
  'storage-full': 507,
} as const;

export type SyncErrorCode = keyof typeof SYNC_ERRORS;

export interface SyncErrorBody {
  error: SyncErrorCode;
  message: string;
}

// ---- checks ----

const sha256Hex: Check<string> = (v, f) => {
  if (!/^[0-9a-f]{64}$/.test(str(v, f)))
    throw new SchemaError(f, 'expected a SHA-256 hash as 64 lowercase hex digits');
  return v as string;
};

const revisionNumber: Check<number> = (v, f) => {
  const n = count(v, f);
  if (n < 1) throw new SchemaError(f, `must be 1 or more, got ${n}`);
  return n;
};

const syncedKind: Check<RecordKind> = (v, f) => {
  if (!SYNCED_KINDS.includes(v as RecordKind))
    throw new SchemaError(
      f,
      `expected one of ${SYNCED_KINDS.join(', ')}, got ${JSON.stringify(v) ?? String(v)}`,
    );
  return v as RecordKind;
};

function bounded<T>(check: Check<T[]>, min: number, max: number): Check<T[]> {
  return (v, f) => {
    const items = check(v, f);
    if (items.length < min || items.length > max)
      throw new SchemaError(f, `expected ${min} to ${max} entries, got ${items.length}`);
    return items;
  };
}

const envelope = object<Omit<Change, 'body'>>({
  kind: syncedKind,
  id: idText,
  revision: revisionNumber,
  updatedAt: isoTime,
  deleted: bool,
  // A resolution names every head it settles, so it may name as many as a record can have.
  replaces: bounded(list(sha256Hex), 0, SYNC_LIMITS.headsPerRecord),
});

/**
 * A body an older app wrote, brought to the current format (record-format.ts) before its check,
 * so a phone not yet updated can still push; one from a newer app is refused by name.
 */
function upgradeIn(kind: RecordKind, raw: unknown, where: string): unknown {
  try {
    return upgradeRecord(kind, raw);
  } catch (e) {
    if (e instanceof SchemaError) throw new SchemaError(`${where}.${e.field}`, e.problem);
    throw e;
  }
}

/**
 * One change: the envelope, then the body through the schema's check for its kind (the same check
 * the restore gate runs), with the field path named from the change down. The body must agree
 * with the envelope on id and revision, so the two never tell different stories.
 */
export const checkChange: Check<Change> = (v, f) => {
  const head = envelope(v, f);
  const raw = (v as { body?: unknown }).body;
  const where = `${f} (${head.kind} ${head.id})`;
  if (head.deleted) {
    if (raw !== null && raw !== undefined)
      throw new SchemaError(`${where}.body`, 'must be null for a deletion');
    return { ...head, body: null };
  }
  const body = KINDS[head.kind].check(
    upgradeIn(head.kind, raw, `${where}.body`),
    `${where}.body`,
  ) as RecordsByKind[RecordKind];
  if (body.id !== head.id)
    throw new SchemaError(`${where}.body.id`, `must equal the change's id ${head.id}`);
  if (body.revision !== head.revision)
    throw new SchemaError(
      `${where}.body.revision`,
      `must equal the change's revision ${head.revision}`,
    );
  return { ...head, body };
};

export const checkPushRequest = object<PushRequest>({
  device: nameText,
  changes: bounded(list(checkChange), 1, SYNC_LIMITS.changesPerPush),
});

const receipt = object<Receipt>({
  kind: syncedKind,
  id: idText,
  revision: revisionNumber,
  hash: sha256Hex,
  repeat: bool,
});

export const checkPushResponse = object<PushResponse>({
  accepted: list(receipt),
  conflicts: list(receipt),
});

const revision = object<Revision>({
  hash: sha256Hex,
  revision: revisionNumber,
  updatedAt: isoTime,
  deleted: bool,
  body: (v) => v,
  device: str,
});

export const checkPullResponse = object<PullResponse>({
  records: list(
    object<PulledRecord>({
      kind: syncedKind,
      id: idText,
      heads: bounded(list(revision), 1, SYNC_LIMITS.headsPerRecord),
    }),
  ),
  cursor: str,
  more: bool,
});

/** Text as it is quoted back in a refusal: short, so a refusal never echoes a long input. */
const quoted = (text: string) => JSON.stringify(text.length > 24 ? `${text.slice(0, 24)}…` : text);

/** A whole number written in decimal digits only (`Number` would also read "", "0x10", "1e3"). */
function decimal(v: unknown, f: string, what: string): number {
  const text = str(v, f);
  if (!/^\d{1,15}$/.test(text)) throw new SchemaError(f, `expected ${what}, got ${quoted(text)}`);
  return Number(text);
}

/**
 * Where a pull resumes: the sequence number of the last revision delivered and the start of that
 * revision's hash, which names the point in this database's history. A database put back from an
 * older copy numbers new revisions again from where the copy ended, so the same number then
 * names another revision (or none), and the server can tell the cursor is not from its history.
 */
export interface Cursor {
  seq: number;
  /** 16 hex digits; null only for the start (seq 0) and for cursors of older servers. */
  mark: string | null;
}

/** Written as `seq` alone at the start, `seq-mark` after it; opaque to the client. */
export const formatCursor = (c: Cursor): string =>
  c.mark === null ? String(c.seq) : `${c.seq}-${c.mark}`;

export const checkCursor: Check<Cursor> = (v, f) => {
  const text = v === undefined ? '0' : str(v, f);
  const parts = /^(\d{1,15})(?:-([0-9a-f]{16}))?$/.exec(text);
  if (!parts)
    throw new SchemaError(f, `expected a cursor from an earlier pull, got ${quoted(text)}`);
  return { seq: Number(parts[1]), mark: parts[2] ?? null };
};

export const checkPullQuery = object<{ since: Cursor; limit: number }>({
  since: checkCursor,
  limit: (v, f) => {
    if (v === undefined) return SYNC_LIMITS.recordsPerPull;
    const n = decimal(v, f, `a whole number from 1 to ${SYNC_LIMITS.recordsPerPull}`);
    if (n < 1 || n > SYNC_LIMITS.recordsPerPull)
      throw new SchemaError(f, `expected a whole number from 1 to ${SYNC_LIMITS.recordsPerPull}`);
    return n;
  },
});

export const checkLabInfo = object<LabInfo>({
  lab: nonEmpty,
  protocol: count,
  photos: object({ enabled: bool, maxBytes: count }),
});

export const checkPhotoUploadRequest = object<PhotoUploadRequest>({
  photoId: idText,
  plateId: idText,
  bytes: (v, f) => {
    const n = count(v, f);
    if (n < 1) throw new SchemaError(f, 'must be 1 or more');
    return n;
  },
  type: oneOf('image/jpeg', 'image/png', 'image/webp', 'image/heic'),
  sha256: sha256Hex,
});

export const checkPhotoUploadState = object<PhotoUploadState>({
  photoId: idText,
  bytes: count,
  received: count,
  complete: bool,
});

export const checkChunkQuery = object<{ offset: number }>({
  offset: (v, f) => decimal(v, f, 'a byte offset in decimal digits'),
});

export const checkErrorBody = object<SyncErrorBody>({
  error: oneOf(...(Object.keys(SYNC_ERRORS) as SyncErrorCode[])),
  message: str,
});

export const checkPhotoPath = object<{ photoId: string }>({ photoId: idText });
