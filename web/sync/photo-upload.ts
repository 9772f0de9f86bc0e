/**
 * Sends one photo to the server in chunks, resuming from what the server already holds: after a
 * dropped connection, the next attempt asks where the upload stands and goes on from there.
 */
import type { BinaryData } from '../../schema/records.ts';
import {
  type PhotoUploadRequest,
  type PhotoUploadState,
  SYNC_LIMITS,
} from '../../schema/sync-protocol.ts';
import type { RecordStore } from '../storage/record-store.ts';
import type { SyncState } from './sync-state.ts';
import type { Outcome, SyncTransport } from './transport.ts';

const TYPES: readonly string[] = ['image/jpeg', 'image/png', 'image/webp', 'image/heic'];

export interface PhotoToSend {
  id: string;
  plateId: string;
  blob: BinaryData;
}

/** SHA-256 of the bytes, lowercase hex, as the server checks it. */
export async function sha256Hex(bytes: Uint8Array<ArrayBuffer>): Promise<string> {
  const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes));
  return Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join('');
}

export async function uploadPhoto(
  transport: SyncTransport,
  photo: PhotoToSend,
  chunkBytes: number = SYNC_LIMITS.chunkBytes,
): Promise<Outcome<PhotoUploadState>> {
  if (!TYPES.includes(photo.blob.type))
    return {
      ok: false,
      failure: {
        code: 'unsupported-type',
        message: `photo ${photo.id} is ${photo.blob.type || 'of no known type'}, not a JPEG, PNG, WebP or HEIC image`,
      },
    };
  const bytes = new Uint8Array(await photo.blob.arrayBuffer());
  const request: PhotoUploadRequest = {
    photoId: photo.id,
    plateId: photo.plateId,
    bytes: bytes.length,
    type: photo.blob.type,
    sha256: await sha256Hex(bytes),
  };
  let state = await transport.beginPhoto(request);
  while (state.ok && !state.value.complete) {
    const at = state.value.received;
    const sent = await transport.sendChunk(photo.id, at, bytes.slice(at, at + chunkBytes));
    // Another attempt got further (or a chunk landed whose answer was lost): ask and go on.
    state =
      !sent.ok && sent.failure.code === 'wrong-offset'
        ? await transport.photoState(photo.id)
        : sent;
  }
  return state;
}

/**
 * Sends every photo on the phone the server does not have yet, up to the lab's size limit. A
 * failed upload ends the sending: it is tried again next round, from where the server stands.
 */
export async function sendNewPhotos(
  deps: { records: RecordStore; state: SyncState; transport: SyncTransport },
  maxBytes: number,
): Promise<void> {
  const { records, state, transport } = deps;
  for (const photo of await records.all('photos')) {
    if (photo.blob.size > maxBytes || (await state.known('photos', photo.id))) continue;
    const sent = await uploadPhoto(transport, {
      id: photo.id,
      plateId: photo.plateId,
      blob: photo.blob,
    });
    if (!sent.ok) return;
    await state.setKnown({
      kind: 'photos',
      id: photo.id,
      hashes: [],
      revision: photo.revision,
      deleted: false,
    });
  }
}
