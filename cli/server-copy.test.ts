/**
 * `rivalplate server copy --from DIR --to postgres://...` on a data folder a SQLite server filled
 * (two labs, tokens one of them revoked, records with a conflict, a photo in chunks): a server on
 * the PostgreSQL copy answers the phones exactly as the SQLite one did (the same pages, heads and
 * cursor, the same photo bytes, the revoked token refused) and goes on from there; a second copy
 * into the same database, and a folder without a database, are refused. Runs in the `postgres`
 * project only (vitest.config.ts), against its throwaway cluster.
 */
import { createHash, randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PhotoUploadState, PullResponse, PushResponse } from '../schema/sync-protocol.ts';
import { tokenHash, tokenId } from '../server/tokens.ts';
import { call, startTestServer, type TestServer, tempDir } from '../tests/sync/harness.ts';
import { benchSession, changeOf, plate, revised } from '../tests/sync/marrowfield.ts';
import { dropDatabase, ENGINE, freshDatabase, queryOnce } from '../tests/sync/test-database.ts';
import { capturedIo } from './captured-io.ts';
import { run } from './server-command.ts';

let data: string;
let target: string;
let token: string;
let revoked: string;
let other: string;
let before: { pages: PullResponse[]; photo: string; used: unknown[] };
const photo = randomBytes(700_000);

/** Every page of a lab's changes, 3 records at a time, as a phone pulls them. */
async function pages(sync: string, t: string): Promise<PullResponse[]> {
  const out: PullResponse[] = [];
  let cursor = '0';
  for (;;) {
    const { json } = await call<PullResponse>(`${sync}/changes?since=${cursor}&limit=3`, t);
    out.push(json);
    cursor = json.cursor;
    if (!json.more) return out;
  }
}

async function photoSha(sync: string, t: string): Promise<string> {
  const res = await fetch(`${sync}/photos/mf-photo-copy`, {
    headers: { authorization: `Bearer ${t}` },
  });
  return createHash('sha256')
    .update(Buffer.from(await res.arrayBuffer()))
    .digest('hex');
}

beforeAll(async () => {
  expect(ENGINE).toBe('postgres');
  data = tempDir();
  const sqlite: TestServer = await startTestServer({ dir: data });
  token = await sqlite.lab('Marrowfield pond');
  revoked = await sqlite.lab('Marrowfield pond');
  other = await sqlite.lab('Quarry lake', { maxBytes: 64 << 20 });
  const push = (t: string, device: string, changes: unknown[]) =>
    call<PushResponse>(`${sqlite.sync}/push`, t, { body: { device, changes } });
  const first = await push(token, 'phone-a', benchSession(6));
  const h = first.json.accepted[4]!.hash;
  const p1 = plate('mf-plate-1');
  await push(token, 'phone-a', [changeOf('plates', revised(p1, { reviewed: true }, 3), [h])]);
  await push(token, 'phone-b', [changeOf('plates', revised(p1, { volumeUl: 50 }, 4), [h])]);
  await push(other, 'phone-q', benchSession(2, 'q-plate'));
  const sha256 = createHash('sha256').update(photo).digest('hex');
  await call(`${sqlite.sync}/photos`, token, {
    body: {
      photoId: 'mf-photo-copy',
      plateId: 'mf-plate-1',
      bytes: photo.length,
      type: 'image/jpeg',
      sha256,
    },
  });
  for (let at = 0; at < photo.length; at += 256 * 1024)
    await call<PhotoUploadState>(`${sqlite.sync}/photos/mf-photo-copy?offset=${at}`, token, {
      method: 'PUT',
      raw: photo.subarray(at, at + 256 * 1024),
      type: 'application/octet-stream',
    });
  await sqlite.close();
  // Revoked from the command line, as an operator does.
  const io = capturedIo(data);
  expect(
    await run(
      ['revoke-token', 'Marrowfield pond', tokenId(tokenHash(revoked)), '--data', data],
      io,
    ),
  ).toBe(0);

  const again = await startTestServer({ dir: data });
  before = {
    pages: await pages(again.sync, token),
    photo: await photoSha(again.sync, token),
    used: await again.rows('SELECT name, used_bytes FROM labs ORDER BY id'),
  };
  await again.close();
  target = await freshDatabase();
});
afterAll(async () => {
  await dropDatabase(data);
  await dropDatabase(target);
});

describe('rivalplate server copy', () => {
  it('copies a data folder into an empty PostgreSQL database, and the phones go on against it', async () => {
    const io = capturedIo(data);
    expect(await run(['copy', '--from', data, '--to', target], io)).toBe(0);
    expect(io.stdout()).toMatch(/2 labs, 3 tokens, 18 revisions, 16 records, 1 uploads, 3 chunks/);
    expect(io.stdout()).toContain('Counts and SHA-256 of every table match');

    const pgServer = await startTestServer({ dir: target });
    try {
      expect(await pages(pgServer.sync, token)).toEqual(before.pages);
      expect(await photoSha(pgServer.sync, token)).toBe(before.photo);
      expect(before.photo).toBe(createHash('sha256').update(photo).digest('hex'));
      expect(await pgServer.rows('SELECT name, used_bytes FROM labs ORDER BY id')).toEqual(
        before.used,
      );
      const refused = await call(`${pgServer.sync}/changes?since=0`, revoked);
      expect(refused.status).toBe(401);
      // A phone's next push and pull go on from its cursor; a new lab gets a new id.
      const cursor = before.pages.at(-1)!.cursor;
      const next = await call<PushResponse>(`${pgServer.sync}/push`, token, {
        body: { device: 'phone-a', changes: [changeOf('plates', plate('mf-plate-after'))] },
      });
      expect(next.status).toBe(200);
      const after = await call<PullResponse>(`${pgServer.sync}/changes?since=${cursor}`, token);
      expect(after.json.records.map((r) => r.id)).toEqual(['mf-plate-after']);
      const newLab = await pgServer.lab('New lab');
      expect(newLab).toMatch(/^rpt_/);
      expect(await queryOnce(target, "SELECT id FROM labs WHERE name = 'New lab'")).toEqual([
        { id: 3 },
      ]);
    } finally {
      await pgServer.close();
    }
  });

  it('refuses a database that holds data, and a folder without a sync database', async () => {
    const io = capturedIo(data);
    expect(await run(['copy', '--from', data, '--to', target], io)).toBe(1);
    expect(io.stderr()).toMatch(/holds data already/);
    const empty = tempDir();
    const io2 = capturedIo(empty);
    expect(await run(['copy', '--from', empty, '--to', target], io2)).toBe(1);
    expect(io2.stderr()).toMatch(/no sync database/);
    await dropDatabase(empty);
    const io3 = capturedIo(empty);
    expect(await run(['copy', '--from', data, '--to', '/var/backups/x.sqlite'], io3)).toBe(2);
  });
});
