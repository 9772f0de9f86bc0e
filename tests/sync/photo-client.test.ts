/**
 * The client's photo upload against the real server: a network failure part-way through, then a
 * later attempt that resumes from the bytes the server holds, checked by SHA-256.
 */
import { createHash, randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex, uploadPhoto } from '../../web/sync/photo-upload.ts';
import { createTransport } from '../../web/sync/transport.ts';
import { startTestServer, type TestServer } from './harness.ts';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

describe('photo upload from the phone', () => {
  it('resumes after the network fails mid-upload and ends with the same bytes', async () => {
    const token = await server.lab('photo-client');
    const bytes = randomBytes(700_000);
    const blob = new Blob([bytes], { type: 'image/jpeg' });
    let chunksSent = 0;
    // The network fails on the third chunk, as when the phone leaves the Wi-Fi.
    const flaky: typeof fetch = (input, init) => {
      if (init?.method === 'PUT' && ++chunksSent === 3)
        return Promise.reject(new TypeError('network is down'));
      return fetch(input, init);
    };
    const photo = { id: 'mf-photo-client', plateId: 'mf-plate-1', blob };
    const first = await uploadPhoto(
      createTransport({ serverUrl: server.origin, token }, flaky),
      photo,
      200_000,
    );
    expect(first).toMatchObject({ ok: false, failure: { code: 'unreachable' } });

    const resumed = await uploadPhoto(
      createTransport({ serverUrl: server.origin, token }),
      photo,
      200_000,
    );
    expect(resumed).toEqual({
      ok: true,
      value: { photoId: 'mf-photo-client', bytes: 700_000, received: 700_000, complete: true },
    });
    const rows = await server.rows(
      "SELECT start FROM chunks WHERE photo_id = 'mf-photo-client' ORDER BY start",
    );
    expect(rows).toEqual([
      { start: 0 },
      { start: 200_000 },
      { start: 400_000 },
      { start: 600_000 },
    ]);
    const back = await fetch(`${server.sync}/photos/mf-photo-client`, {
      headers: { authorization: `Bearer ${token}` },
    });
    expect(
      createHash('sha256')
        .update(Buffer.from(await back.arrayBuffer()))
        .digest('hex'),
    ).toBe(createHash('sha256').update(bytes).digest('hex'));
  });

  it('a second phone fetches the photo whole; one not yet uploaded is named as missing', async () => {
    const token = await server.lab('photo-client');
    const bytes = randomBytes(300_000);
    const transport = createTransport({ serverUrl: server.origin, token });
    const photo = {
      id: 'mf-photo-shared',
      plateId: 'mf-plate-2',
      blob: new Blob([bytes], { type: 'image/jpeg' }),
    };
    expect((await uploadPhoto(transport, photo)).ok).toBe(true);

    const other = createTransport({ serverUrl: server.origin, token });
    const got = await other.photo('mf-photo-shared');
    if (!got.ok) throw new Error(got.failure.message);
    expect(got.value.type).toBe('image/jpeg');
    expect(
      createHash('sha256')
        .update(Buffer.from(await got.value.arrayBuffer()))
        .digest('hex'),
    ).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(await other.photo('mf-photo-never')).toMatchObject({
      ok: false,
      failure: { code: 'not-found', message: expect.stringContaining('mf-photo-never') },
    });
  });

  it('hashes with SHA-256 as node:crypto does (FIPS 180-4 test vector "abc")', async () => {
    expect(await sha256Hex(new TextEncoder().encode('abc') as Uint8Array<ArrayBuffer>)).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });
});
