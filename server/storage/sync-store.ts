/**
 * What the sync server needs from its database, and nothing about how a database does it. The
 * handlers see only this interface; SQLite (sqlite-store.ts) is the one engine today. Methods are
 * async so an engine that talks over a network fits the same shape.
 *
 * Every method that writes does so in one transaction: it happens wholly or not at all.
 */
import type {
  Change,
  Cursor,
  PhotoUploadRequest,
  PullResponse,
  PushResponse,
} from '../../schema/sync-protocol.ts';

export interface Lab {
  id: number;
  name: string;
  photosEnabled: boolean;
  photoMaxBytes: number;
  /**
   * The most bytes the lab's records and photos may take on the server, so one lab cannot fill
   * it for every other; null for no cap of its own (labs made before caps existed).
   */
  maxBytes: number | null;
}

export type LabSettings = Pick<Lab, 'photosEnabled' | 'photoMaxBytes'> & {
  maxBytes?: number | null;
};

/**
 * Revisions kept of one record. Older ones that are no longer heads are dropped as new ones
 * arrive: a pull only ever sends heads, so they serve nothing but the repeat check of a push
 * retried very late (which then stores it again, as a head beside the others: a conflict, not a
 * loss), and without a limit one record edited for years would grow without end.
 */
export const REVISIONS_KEPT = 100;

/** A lab token as its operator sees it: never the token itself, never its whole hash. */
export interface TokenInfo {
  /** Names the token in `list-tokens` and `revoke-token` (tokens.ts, `tokenId`). */
  id: string;
  label: string | null;
  createdAt: string;
  /** The day (UTC, YYYY-MM-DD) of the last request it was accepted for; null if never. */
  lastUsedOn: string | null;
  revokedAt: string | null;
}

/** What a token presented with a request opens: its lab, unless it was revoked. */
export interface TokenAccess {
  lab: Lab;
  revokedAt: string | null;
}

/** A change with the server's name for its revision (revision-hash.ts). */
export interface HashedChange {
  change: Change;
  hash: string;
}

/** A photo upload as stored: what was announced, and how far the bytes have come. */
export interface Upload extends PhotoUploadRequest {
  received: number;
  complete: boolean;
  /** Set when the bytes just completed did not match the SHA-256: they were dropped. */
  mismatch?: true;
}

export interface SyncStore {
  /** Refuses (`invalid-request`) a name already taken. */
  addLab(name: string, settings: LabSettings): Promise<Lab>;
  findLab(name: string): Promise<Lab | undefined>;
  addToken(labId: number, tokenHash: string, label?: string): Promise<TokenInfo>;
  /** The lab's tokens, revoked ones included, oldest first. */
  listTokens(labId: number): Promise<TokenInfo[]>;
  /**
   * Revokes the lab's tokens with this id (one, unless two hashes share their first characters)
   * and returns them as they were before, so the caller can tell one revoked earlier.
   */
  revokeToken(labId: number, id: string): Promise<TokenInfo[]>;
  /**
   * Read afresh on every call, so a revocation made by another process counts at once; notes the
   * day of an accepted use. Undefined for a token never made.
   */
  tokenAccess(tokenHash: string): Promise<TokenAccess | undefined>;

  /**
   * Applies a whole push in one transaction; a repeat of a stored revision writes nothing. A push
   * that would take the lab past its `maxBytes` is refused whole (`storage-full`).
   */
  push(labId: number, device: string, changes: HashedChange[]): Promise<PushResponse>;
  /**
   * Records whose heads changed after `since`, oldest change first: at most `limit` of them, and
   * no more than fill `maxBytes` of answer (but always one, however large). Refuses
   * (`cursor-unknown`) a cursor whose point is not in this database's history.
   */
  pull(labId: number, since: Cursor, limit: number, maxBytes: number): Promise<PullResponse>;

  /**
   * Starts an upload, or returns the one already started for the same photo. Refuses a lab that
   * has `SYNC_LIMITS.openUploads` unfinished uploads touched within a day (`too-many-uploads`;
   * an older one is dropped to make room), and one whose announced bytes would not fit its
   * `maxBytes` (`storage-full`). This and `upload`
   * finish an upload whose bytes are all in but which is not yet complete (left by a crash of an
   * older server), as `appendChunk` would have.
   */
  beginUpload(labId: number, request: PhotoUploadRequest): Promise<Upload>;
  upload(labId: number, photoId: string): Promise<Upload | undefined>;
  /**
   * Stores a chunk only if `offset` is where the upload stands (refuses `wrong-offset`). The
   * chunk that completes the photo is checked against the SHA-256 in the same transaction: the
   * upload ends complete, or (`mismatch`) emptied to start over.
   */
  appendChunk(labId: number, photoId: string, offset: number, bytes: Buffer): Promise<Upload>;
  /** The stored bytes of a photo, chunk by chunk in order, never all in memory at once. */
  photoChunks(labId: number, photoId: string): AsyncIterable<Buffer>;

  close(): Promise<void>;
}
