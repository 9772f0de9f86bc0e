/**
 * Photo uploads in chunks over real HTTP on loopback: resumption from the server's offset, the
 * size limit, the lab setting, and the SHA-256 check (FIPS 180-4, via node:crypto) of the whole.
 */
import { createHash, randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PhotoUploadState, SyncErrorBody } from '../schema/sync-protocol.ts';
import { call, startTestServer, type TestServer } from '../tests/sync/harness.ts';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const announce = (token: string, photoId: string, bytes: Buffer, claimed = sha(bytes)) =>
  call<PhotoUploadState & SyncErrorBody>(`${server.sync}/photos`, token, {
    body: {
      photoId,
      plateId: 'mf-plate-1',
      bytes: bytes.length,
      type: 'image/jpeg',
      sha256: claimed,
    },
  });
const chunk = (token: string, photoId: string, offset: number, bytes: Buffer) =>
  call<PhotoUploadState & SyncErrorBody>(
    `${server.sync}/photos/${photoId}?offset=${offset}`,
    token,
    {
      method: 'PUT',
      raw: bytes,
      type: 'application/octet-stream',
    },
  );

describe('photo uploads', () => {
  it('takes a photo in chunks and gives back the same bytes', async () => {
    const token = await server.lab('photos');
    const photo = randomBytes(300_000);
    expect((await announce(token, 'mf-photo-1', photo)).json).toEqual({
      photoId: 'mf-photo-1',
      bytes: 300_000,
      received: 0,
      complete: false,
    });
    for (let at = 0; at < photo.length; at += 128 * 1024) {
      const r = await chunk(token, 'mf-photo-1', at, photo.subarray(at, at + 128 * 1024));
      expect(r.status).toBe(200);
      expect(r.json.received).toBe(Math.min(at + 128 * 1024, photo.length));
    }
    const state = await call<PhotoUploadState>(`${server.sync}/photos/mf-photo-1/upload`, token);
    expect(state.json.complete).toBe(true);
    const back = await fetch(`${server.sync}/photos/mf-photo-1`, {
      headers: { authorization: `Bearer ${token}` },
    });
    expect(back.headers.get('content-type')).toBe('image/jpeg');
    expect(sha(Buffer.from(await back.arrayBuffer()))).toBe(sha(photo));
    // Announcing the same photo again says where it stands instead of starting over.
    expect((await announce(token, 'mf-photo-1', photo)).json.complete).toBe(true);
  });

  it('refuses a chunk at the wrong offset and says where to resume', async () => {
    const token = await server.lab('photos-offset');
    const photo = randomBytes(10_000);
    await announce(token, 'mf-photo-2', photo);
    await chunk(token, 'mf-photo-2', 0, photo.subarray(0, 4000));
    const skip = await chunk(token, 'mf-photo-2', 8000, photo.subarray(8000));
    expect(skip.status).toBe(409);
    expect(skip.json).toEqual({
      error: 'wrong-offset',
      message: 'photo mf-photo-2 has 4000 of 10000 bytes; send the chunk at 4000',
    });
    const again = await chunk(token, 'mf-photo-2', 0, photo.subarray(0, 4000));
    expect(again.status).toBe(409);
    const past = await chunk(token, 'mf-photo-2', 4000, randomBytes(7000));
    expect(past.json.error).toBe('too-large');
    expect((await chunk(token, 'mf-photo-2', 4000, photo.subarray(4000))).json.complete).toBe(true);
  });

  it('starts over when the bytes do not match the announced SHA-256', async () => {
    const token = await server.lab('photos-hash');
    const photo = randomBytes(5000);
    await announce(token, 'mf-photo-3', photo, sha(Buffer.from('another photo')));
    const r = await chunk(token, 'mf-photo-3', 0, photo);
    expect(r.status).toBe(409);
    expect(r.json.error).toBe('upload-mismatch');
    const state = await call<PhotoUploadState>(`${server.sync}/photos/mf-photo-3/upload`, token);
    expect(state.json).toMatchObject({ received: 0, complete: false });
    expect(
      await server.rows("SELECT count(*) AS n FROM chunks WHERE photo_id = 'mf-photo-3'"),
    ).toEqual([{ n: 0 }]);
  });

  it("keeps to the lab's size limit and to a lab that keeps photos on the phones", async () => {
    const token = await server.lab('photos-small', { photoMaxBytes: 1000 });
    const big = await announce(token, 'mf-photo-4', randomBytes(1001));
    expect(big.status).toBe(413);
    expect(big.json.message).toBe(
      'photo mf-photo-4 is 1001 bytes; lab "photos-small" takes photos up to 1000 bytes',
    );
    const off = await server.lab('photos-off', { photosEnabled: false });
    const refused = await announce(off, 'mf-photo-5', randomBytes(10));
    expect(refused.status).toBe(403);
    expect(refused.json.error).toBe('photos-off');
    const info = await call<{ photos: unknown }>(`${server.sync}/lab`, off);
    expect(info.json.photos).toEqual({ enabled: false, maxBytes: 0 });
  });

  it('refuses a chunk over the chunk limit, of the wrong type, or for an unknown photo', async () => {
    const token = await server.lab('photos-chunks');
    const photo = randomBytes(2 * 1024 * 1024);
    await announce(token, 'mf-photo-6', photo);
    expect((await chunk(token, 'mf-photo-6', 0, photo)).status).toBe(413);
    const json = await call<SyncErrorBody>(`${server.sync}/photos/mf-photo-6?offset=0`, token, {
      method: 'PUT',
      body: { bytes: 'no' },
    });
    expect(json.status).toBe(400);
    expect((await chunk(token, 'nobody', 0, randomBytes(10))).status).toBe(404);
    expect((await chunk(token, 'mf-photo-6', -1, randomBytes(10))).json.message).toBe(
      'query.offset: expected a byte offset in decimal digits, got "-1"',
    );
  });
});
