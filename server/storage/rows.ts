/**
 * What both engines share about rows: their shapes as read (the same columns in both schemas,
 * sql.ts), how they become the interface's objects, and what a stored revision costs its lab.
 */
import { formatCursor, type Revision } from '../../schema/sync-protocol.ts';
import { tokenId } from '../tokens.ts';
import type { Lab, TokenInfo, Upload } from './sync-store.ts';

/**
 * The bytes a stored revision counts against its lab: its body, device and id as UTF-8, and a
 * fixed part for the hash, times and row (SQLite's third migration step, sql.ts, reckons the same in SQL).
 */
export function storedBytes(body: string | null, device: string, id: string): number {
  return Buffer.byteLength(body ?? '') + Buffer.byteLength(device) + Buffer.byteLength(id) + 100;
}

export const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** An unfinished upload untouched this long may be dropped to make room for a new one. */
export const ABANDONED_MS = 24 * 60 * 60 * 1000;

export interface LabRow {
  id: number;
  name: string;
  photos_enabled: number;
  photo_max_bytes: number;
  max_bytes: number | null;
  used_bytes: number;
}

export interface TokenRow {
  hash: string;
  label: string | null;
  created_at: string;
  last_used_on: string | null;
  revoked_at: string | null;
}

export interface RevisionRow {
  hash: string;
  revision: number;
  updated_at: string;
  deleted: number;
  body: string | null;
  device: string;
}

export interface UploadRow {
  photo_id: string;
  plate_id: string;
  bytes: number;
  type: string;
  sha256: string;
  received: number;
  complete: number;
}

export const labFromRow = (r: LabRow): Lab => ({
  id: r.id,
  name: r.name,
  photosEnabled: r.photos_enabled === 1,
  photoMaxBytes: r.photo_max_bytes,
  maxBytes: r.max_bytes,
});

export const tokenFromRow = (r: TokenRow): TokenInfo => ({
  id: tokenId(r.hash),
  label: r.label,
  createdAt: r.created_at,
  lastUsedOn: r.last_used_on,
  revokedAt: r.revoked_at,
});

export const uploadFromRow = (r: UploadRow): Upload => ({
  photoId: r.photo_id,
  plateId: r.plate_id,
  bytes: r.bytes,
  type: r.type,
  sha256: r.sha256,
  received: r.received,
  complete: r.complete === 1,
});

export const revisionFromRow = (r: RevisionRow): Revision => ({
  hash: r.hash,
  revision: r.revision,
  updatedAt: r.updated_at,
  deleted: r.deleted === 1,
  body: r.body === null ? null : JSON.parse(r.body),
  device: r.device,
});

/**
 * Bytes a pull answer takes as sent: the page's fixed part plus each record with its comma, all
 * in UTF-8, so device ids and text in any script count at their real size.
 */
export const PAGE_OVERHEAD = Buffer.byteLength(
  JSON.stringify({
    records: [],
    cursor: formatCursor({ seq: 1e15 - 1, mark: 'f'.repeat(16) }),
    more: false,
  }),
);
