/**
 * The sync protocol over real HTTP on loopback against a real SQLite file. Bearer tokens are
 * checked as RFC 6750 describes them; status codes are those of RFC 9110 (and 507 of RFC 4918).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RECORD_FORMAT } from '../schema/record-format.ts';
import type { PullResponse, PushResponse, SyncErrorBody } from '../schema/sync-protocol.ts';
import { SYNC_LIMITS } from '../schema/sync-protocol.ts';
import { call, ENGINE, startTestServer, type TestServer } from '../tests/sync/harness.ts';
import {
  analysis,
  assay,
  benchSession,
  changeOf,
  experiment,
  plate,
  revised,
  tombstoneOf,
} from '../tests/sync/marrowfield.ts';
import { revisionHash } from './revision-hash.ts';
import { REVISIONS_KEPT } from './storage/sync-store.ts';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

const push = (token: string | null, body: unknown) =>
  call<PushResponse & SyncErrorBody>(`${server.sync}/push`, token, { body });
const pull = (token: string, since = '0', limit?: number) =>
  call<PullResponse>(
    `${server.sync}/changes?since=${since}${limit ? `&limit=${limit}` : ''}`,
    token,
  );
const revisionCount = async (lab: string) =>
  (
    (
      await server.rows(
        'SELECT count(*) AS n FROM revisions JOIN labs ON labs.id = revisions.lab_id WHERE labs.name = ?',
        lab,
      )
    )[0] as { n: number }
  ).n;

describe('push and pull', () => {
  it('round-trips a bench session: every record comes back with one head and its body', async () => {
    const token = await server.lab('round-trip');
    const changes = benchSession(3);
    const pushed = await push(token, { device: 'phone-a', changes });
    expect(pushed.status).toBe(200);
    expect(pushed.json.accepted).toHaveLength(7);
    expect(pushed.json.conflicts).toEqual([]);

    const pulled = await pull(token);
    expect(pulled.status).toBe(200);
    expect(pulled.json.more).toBe(false);
    expect(pulled.json.records.map((r) => `${r.kind}/${r.id}`)).toEqual(
      changes.map((c) => `${c.kind}/${c.id}`),
    );
    for (const [i, record] of pulled.json.records.entries()) {
      expect(record.heads).toHaveLength(1);
      expect(record.heads[0]!.body).toEqual(changes[i]!.body);
      expect(record.heads[0]!.hash).toBe(pushed.json.accepted[i]!.hash);
      expect(record.heads[0]!.device).toBe('phone-a');
    }
  });

  it('the same batch pushed twice changes nothing the second time', async () => {
    const token = await server.lab('twice');
    const body = { device: 'phone-a', changes: benchSession(5) };
    const first = await push(token, body);
    const before = await revisionCount('twice');
    const second = await push(token, body);
    expect(second.status).toBe(200);
    expect(second.json.accepted.map((r) => r.hash)).toEqual(first.json.accepted.map((r) => r.hash));
    expect(second.json.accepted.every((r) => r.repeat)).toBe(true);
    expect(await revisionCount('twice')).toBe(before);
    expect(before).toBe(9);
    const { json } = await pull(token);
    expect(json.records).toHaveLength(9);
  });

  it('a repeat is recognised whatever the order of the keys in its body', async () => {
    const token = await server.lab('key-order');
    const p = plate('mf-plate-ko');
    const reordered = Object.fromEntries(Object.entries(p).reverse());
    await push(token, { device: 'a', changes: [changeOf('plates', p)] });
    const again = await push(token, {
      device: 'a',
      changes: [{ ...changeOf('plates', p), body: reordered }],
    });
    expect(again.json.accepted[0]!.repeat).toBe(true);
    expect(await revisionCount('key-order')).toBe(1);
  });

  it('an edit on top of the head replaces it; a deletion travels as a tombstone', async () => {
    const token = await server.lab('edits');
    const p1 = plate('mf-plate-e');
    const h1 = (await push(token, { device: 'a', changes: [changeOf('plates', p1)] })).json
      .accepted[0]!.hash;
    const p2 = revised(p1, { reviewed: true }, 10);
    const h2 = (await push(token, { device: 'a', changes: [changeOf('plates', p2, [h1])] })).json
      .accepted[0]!.hash;
    let { json } = await pull(token);
    expect(json.records[0]!.heads.map((h) => h.hash)).toEqual([h2]);

    const gone = await push(token, {
      device: 'a',
      changes: [tombstoneOf('plates', p1.id, 3, 11, [h2])],
    });
    expect(gone.json.accepted).toHaveLength(1);
    ({ json } = await pull(token));
    expect(json.records[0]!.heads).toMatchObject([{ deleted: true, body: null, revision: 3 }]);
  });
});

describe('records of an older format', () => {
  it('takes an assay pushed by an app of format 2 (no block) and serves it at the current format', async () => {
    const token = await server.lab('format-2');
    const { block: _unrecorded, ...older } = { ...assay('mf-L2-r1', 'L2', 1), format: 2 };
    const pushed = await push(token, {
      device: 'older-phone',
      changes: [{ ...changeOf('assays', assay('mf-L2-r1', 'L2', 1)), body: older }],
    });
    expect(pushed.status).toBe(200);
    const { json } = await pull(token);
    expect(json.records[0]!.heads[0]!.body).toEqual({
      ...older,
      block: null,
      format: RECORD_FORMAT,
    });
    const blocked = { ...assay('mf-L2-r2', 'L2', 2), block: 'day 2' };
    expect(
      (await push(token, { device: 'a', changes: [changeOf('assays', blocked)] })).status,
    ).toBe(200);
    const again = await pull(token);
    expect(again.json.records.find((r) => r.id === 'mf-L2-r2')!.heads[0]!.body).toEqual(blocked);
  });

  it('refuses a body from a newer app by name, with the field path', async () => {
    const token = await server.lab('format-newer');
    const newer = { ...assay('mf-L2-r1', 'L2', 1), format: RECORD_FORMAT + 1 };
    const refused = await push(token, {
      device: 'a',
      changes: [{ ...changeOf('assays', newer), body: newer }],
    });
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.json)).toContain('body.format: written by a newer version');
  });
});

describe('two phones editing the same plate offline', () => {
  it('keeps both revisions as a conflict until a revision replacing both resolves it', async () => {
    const token = await server.lab('two-phones');
    const base = plate('mf-plate-7');
    const h0 = (await push(token, { device: 'phone-a', changes: [changeOf('plates', base)] })).json
      .accepted[0]!.hash;

    const onA = revised(base, { typedCounts: { test: 120, reference: 97 } }, 20);
    const onB = revised(base, { typedCounts: { test: 112, reference: 101 } }, 21);
    const a = await push(token, { device: 'phone-a', changes: [changeOf('plates', onA, [h0])] });
    const b = await push(token, { device: 'phone-b', changes: [changeOf('plates', onB, [h0])] });
    expect(a.json.accepted).toHaveLength(1);
    expect(b.json.conflicts).toHaveLength(1);

    const { json } = await pull(token);
    const heads = json.records.find((r) => r.id === 'mf-plate-7')!.heads;
    expect(heads.map((h) => h.device).sort()).toEqual(['phone-a', 'phone-b']);
    expect(heads.map((h) => h.body)).toEqual(expect.arrayContaining([onA, onB]));

    const merged = { ...revised(onB, { typedCounts: { test: 120, reference: 101 } }, 30) };
    const resolve = await push(token, {
      device: 'phone-b',
      changes: [
        changeOf(
          'plates',
          merged,
          heads.map((h) => h.hash),
        ),
      ],
    });
    expect(resolve.json.accepted).toHaveLength(1);
    const after = await pull(token, json.cursor);
    expect(after.json.records).toHaveLength(1);
    expect(after.json.records[0]!.heads.map((h) => h.body)).toEqual([merged]);
    // Nothing was thrown away on the way: the base, both edits and the resolution.
    expect(await revisionCount('two-phones')).toBe(4);
  });
});

describe('pull cursor', () => {
  it('resumes where the last page ended and brings only what changed after it', async () => {
    const token = await server.lab('cursor');
    await push(token, { device: 'a', changes: benchSession(8) });
    const seen: string[] = [];
    let cursor = '0';
    const pages: number[] = [];
    for (;;) {
      const { json } = await pull(token, cursor, 5);
      pages.push(json.records.length);
      seen.push(...json.records.map((r) => r.id));
      cursor = json.cursor;
      if (!json.more) break;
    }
    expect(pages).toEqual([5, 5, 2]);
    expect(new Set(seen).size).toBe(12);

    const quiet = await pull(token, cursor);
    expect(quiet.json).toEqual({ records: [], cursor, more: false });
    await push(token, { device: 'a', changes: [changeOf('plates', plate('mf-plate-late'))] });
    const late = await pull(token, cursor);
    expect(late.json.records.map((r) => r.id)).toEqual(['mf-plate-late']);
  });
});

describe('pull size', () => {
  it('cuts a page at the byte budget, so a phone is never sent one answer too big to finish', async () => {
    const token = await server.lab('pull-bytes');
    // 180 dense analyses of about 28 KB each: 5 MB, over the 4 MiB budget of one page.
    const changes = Array.from({ length: 180 }, (_, i) =>
      changeOf('analyses', analysis(`mf-an-big-${i}`, `mf-plate-${i}`, 200)),
    );
    await push(token, { device: 'a', changes });
    const first = await pull(token);
    expect(first.json.more).toBe(true);
    expect(first.json.records.length).toBeGreaterThan(50);
    expect(first.json.records.length).toBeLessThan(180);
    const rest = await pull(token, first.json.cursor);
    expect(rest.json.more).toBe(false);
    expect(first.json.records.length + rest.json.records.length).toBe(180);
  });
});

describe('labs are kept apart', () => {
  it("a token of one lab sees none of another lab's records or photos", async () => {
    const tokenA = await server.lab('lab-a');
    const tokenB = await server.lab('lab-b');
    await push(tokenB, { device: 'b', changes: benchSession(2) });
    const started = await call(`${server.sync}/photos`, tokenB, {
      body: {
        photoId: 'mf-photo-b',
        plateId: 'mf-plate-1',
        bytes: 3,
        type: 'image/jpeg',
        sha256: 'a'.repeat(64),
      },
    });
    expect(started.status).toBe(200);

    expect((await pull(tokenA)).json.records).toEqual([]);
    const photo = await call<SyncErrorBody>(`${server.sync}/photos/mf-photo-b/upload`, tokenA);
    expect(photo.status).toBe(404);
    // Lab A's own records with the same ids are its own: lab B's stay as they were.
    await push(tokenA, { device: 'a', changes: [changeOf('experiments', experiment())] });
    const b = await pull(tokenB);
    expect(b.json.records).toHaveLength(6);
    expect(b.json.records.every((r) => r.heads[0]!.device === 'b')).toBe(true);
  });
});

describe('refusals: a clear 4xx, and nothing written', () => {
  it('no token, a malformed header, an unknown token', async () => {
    await server.lab('refusals');
    const before = await revisionCount('refusals');
    const body = { device: 'a', changes: benchSession(1) };
    const none = await push(null, body);
    expect(none.status).toBe(401);
    expect(none.json.error).toBe('no-token');
    const basic = await fetch(`${server.sync}/changes`, {
      headers: { authorization: 'Basic eDp5' },
    });
    expect(basic.status).toBe(401);
    const unknown = await push('rpt_not-a-real-token', body);
    expect(unknown.status).toBe(401);
    expect(unknown.json).toEqual({
      error: 'bad-token',
      message: 'this token is not known to the server: ask for a new one',
    });
    expect(await revisionCount('refusals')).toBe(before);
  });

  it('a body that is not JSON, or not an object of the right shape', async () => {
    const token = await server.lab('malformed');
    const cut = await call<SyncErrorBody>(`${server.sync}/push`, token, { raw: '{"device":"a",' });
    expect(cut.status).toBe(400);
    expect(cut.json.error).toBe('invalid-request');
    expect(cut.json.message).toMatch(/not valid JSON/);
    const list = await push(token, [1, 2]);
    expect(list.status).toBe(400);
    expect(list.json.message).toMatch(/^body: expected an object/);
    const text = await call<SyncErrorBody>(`${server.sync}/push`, token, {
      raw: 'x',
      type: 'text/plain',
    });
    expect(text.status).toBe(415);
    expect(text.json.error).toBe('unsupported-type');
    expect(await revisionCount('malformed')).toBe(0);
  });

  it('wrong types name the field and the record, and refuse the whole batch', async () => {
    const token = await server.lab('types');
    const changes = benchSession(3);
    const bad = changes[5]!;
    changes[5] = { ...bad, body: { ...(bad.body as object), dilutionFold: '1e5' } as never };
    const r = await push(token, { device: 'a', changes });
    expect(r.status).toBe(400);
    expect(r.json.message).toBe(
      'body.changes[5] (plates mf-plate-2).body.dilutionFold: expected a number, got "1e5"',
    );
    const cases: [unknown, RegExp][] = [
      [{ ...changes[0], kind: 'photos' }, /changes\[0\]\.kind: expected one of experiments, /],
      [{ ...changes[0], revision: 0 }, /changes\[0\]\.revision: must be 1 or more/],
      [{ ...changes[0], replaces: ['abc'] }, /changes\[0\]\.replaces\[0\]: expected a SHA-256/],
      [{ ...changes[0], id: 'other' }, /\(experiments other\)\.body\.id: must equal/],
      [{ ...changes[0], deleted: true }, /\.body: must be null for a deletion/],
    ];
    for (const [change, message] of cases) {
      const answer = await push(token, { device: 'a', changes: [change] });
      expect(answer.status).toBe(400);
      expect(answer.json.message).toMatch(message);
    }
    const empty = await push(token, { device: 'a', changes: [] });
    expect(empty.json.message).toBe('body.changes: expected 1 to 200 entries, got 0');
    expect(await revisionCount('types')).toBe(0);
  });

  it('an oversized body and an overlong batch', async () => {
    const token = await server.lab('oversized');
    const huge = {
      device: 'a',
      changes: benchSession(1),
      padding: 'x'.repeat(SYNC_LIMITS.pushBytes),
    };
    const big = await push(token, huge);
    expect(big.status).toBe(413);
    expect(big.json.error).toBe('too-large');
    const long = await push(token, {
      device: 'a',
      changes: benchSession(SYNC_LIMITS.changesPerPush),
    });
    expect(long.status).toBe(400);
    expect(long.json.message).toMatch(/expected 1 to 200 entries, got 204/);
    expect(await revisionCount('oversized')).toBe(0);
  });

  it('a pull with a cursor or limit that is not a number', async () => {
    const token = await server.lab('bad-cursor');
    expect((await pull(token, 'yesterday')).json).toMatchObject({
      error: 'invalid-request',
      message: 'query.since: expected a cursor from an earlier pull, got "yesterday"',
    });
    expect((await pull(token, '0', 100_000)).status).toBe(400);
  });

  it('an older protocol path is told to update; an unknown route is not found', async () => {
    const old = await call<SyncErrorBody>(`${server.origin}/sync/v0/changes`, null);
    expect(old.status).toBe(426);
    expect(old.json.error).toBe('version-too-old');
    const unknown = await call<SyncErrorBody>(`${server.sync}/nothing-here`, null);
    expect(unknown.status).toBe(404);
  });
});

describe('storage full', () => {
  // The cap of the SQLite file (--max-db-mb); PostgreSQL's room is its operator's to size, and a
  // full disk there is refused the same way (postgres-store.ts). Lab caps run on both, below.
  it.skipIf(ENGINE === 'postgres')(
    'refuses a push that does not fit with 507, writes none of it, and takes small ones after',
    async () => {
      const small = await startTestServer({ maxBytes: 256 * 1024 });
      try {
        const token = await small.lab('full');
        // A long note makes each analysis a few kilobytes: 60 of them cannot fit in 256 KiB.
        const bulky = Array.from({ length: 60 }, (_, i) =>
          changeOf('analyses', {
            ...analysis(`mf-an-full-${i}`, `mf-plate-${i}`, 1),
            flags: [{ kind: 'note', values: {}, detail: 'y'.repeat(6000) }],
          }),
        );
        const refused = await call<SyncErrorBody>(`${small.sync}/push`, token, {
          body: { device: 'a', changes: bulky },
        });
        expect(refused.status).toBe(507);
        expect(refused.json.error).toBe('storage-full');
        expect(await small.rows('SELECT count(*) AS n FROM revisions')).toEqual([{ n: 0 }]);
        const fits = await call<PushResponse>(`${small.sync}/push`, token, {
          body: { device: 'a', changes: benchSession(1) },
        });
        expect(fits.status).toBe(200);
        expect(await small.rows('SELECT count(*) AS n FROM revisions')).toEqual([{ n: 5 }]);
      } finally {
        await small.close();
      }
    },
  );
});

describe('per-lab quotas', () => {
  it("one lab filling its share refuses that lab's pushes and photos, and no other lab's", async () => {
    const full = await server.lab('quota-full', { maxBytes: 256 * 1024 });
    const other = await server.lab('quota-other', { maxBytes: 256 * 1024 });
    const bulky = (from: number) =>
      Array.from({ length: 20 }, (_, i) =>
        changeOf('analyses', {
          ...analysis(`mf-an-q-${from + i}`, `mf-plate-${i}`, 1),
          flags: [{ kind: 'note', values: {}, detail: 'q'.repeat(8000) }],
        }),
      );
    // 20 records of about 8 KB fit; the next 20 would pass 256 KiB and are refused whole.
    expect((await push(full, { device: 'a', changes: bulky(0) })).status).toBe(200);
    const refused = await push(full, { device: 'a', changes: bulky(20) });
    expect(refused.status).toBe(507);
    expect(refused.json).toMatchObject({ error: 'storage-full' });
    expect(refused.json.message).toMatch(/lab "quota-full" holds .* of the 0\.3 MB it may use/);
    expect(await revisionCount('quota-full')).toBe(20);
    const photo = await call<SyncErrorBody>(`${server.sync}/photos`, full, {
      body: {
        photoId: 'q-photo',
        plateId: 'p',
        bytes: 200_000,
        type: 'image/jpeg',
        sha256: 'a'.repeat(64),
      },
    });
    expect(photo.json.error).toBe('storage-full');
    // The other lab is untouched by it.
    expect((await push(other, { device: 'b', changes: bulky(0) })).status).toBe(200);
  });

  it('holds at most 16 unfinished uploads per lab', async () => {
    const token = await server.lab('open-uploads');
    const announce = (i: number) =>
      call<SyncErrorBody>(`${server.sync}/photos`, token, {
        body: {
          photoId: `open-${i}`,
          plateId: 'p',
          bytes: 10,
          type: 'image/jpeg',
          sha256: 'b'.repeat(64),
        },
      });
    for (let i = 0; i < SYNC_LIMITS.openUploads; i++) expect((await announce(i)).status).toBe(200);
    const more = await announce(99);
    expect(more.status).toBe(429);
    expect(more.json.error).toBe('too-many-uploads');
    // Announcing one already open again is not a new upload.
    expect((await announce(3)).status).toBe(200);
  });
});

describe('revisions kept', () => {
  it(`keeps the newest ${REVISIONS_KEPT} revisions of a record and its heads, and counts what it dropped`, async () => {
    const token = await server.lab('kept');
    // A second head, pushed first on no base, stays however old it gets among the revisions.
    const side = revised(plate('mf-plate-kept'), { reviewed: true }, 0);
    await push(token, { device: 'b', changes: [changeOf('plates', side, [])] });
    let current = plate('mf-plate-kept');
    let replaces: string[] = [];
    for (let i = 0; i < REVISIONS_KEPT + 30; i++) {
      if (i > 0) current = revised(current, { volumeUl: 100 + i }, i);
      const answer = await push(token, {
        device: 'a',
        changes: [changeOf('plates', current, replaces)],
      });
      replaces = [...answer.json.accepted, ...answer.json.conflicts].map((r) => r.hash);
    }
    expect(await revisionCount('kept')).toBe(REVISIONS_KEPT + 1);
    const { json } = await pull(token);
    expect(json.records[0]!.heads.map((h) => h.revision).sort((x, y) => x - y)).toEqual([2, 130]);
    expect(await server.rows("SELECT used_bytes AS n FROM labs WHERE name = 'kept'")).toEqual(
      await server.rows(
        `SELECT sum(octet_length(coalesce(body, '')) + octet_length(device)
                    + octet_length(record_id) + 100) AS n
         FROM revisions JOIN labs ON labs.id = lab_id WHERE labs.name = 'kept'`,
      ),
    );
  });

  it('keeps the same revisions when they all come in one push, each replacing the one before', async () => {
    const token = await server.lab('kept-one-push');
    const changes = [];
    let current = plate('mf-plate-one-push');
    let replaces: string[] = [];
    for (let i = 0; i < REVISIONS_KEPT + 10; i++) {
      if (i > 0) current = revised(current, { volumeUl: 100 + i }, i);
      const change = changeOf('plates', current, replaces);
      changes.push(change);
      replaces = [revisionHash(change)];
    }
    const answer = await push(token, { device: 'a', changes });
    expect(answer.status).toBe(200);
    expect(answer.json.accepted.map((r) => r.hash)).toEqual(changes.map(revisionHash));
    expect(answer.json.conflicts).toEqual([]);
    expect(await revisionCount('kept-one-push')).toBe(REVISIONS_KEPT);
    const { json } = await pull(token);
    expect(json.records).toHaveLength(1);
    expect(json.records[0]!.heads.map((h) => h.revision)).toEqual([REVISIONS_KEPT + 10]);
    // The newest five again: all still stored, so all repeats, and nothing changes.
    const again = await push(token, { device: 'a', changes: changes.slice(-5) });
    expect(again.json.accepted.every((r) => r.repeat)).toBe(true);
    expect(await revisionCount('kept-one-push')).toBe(REVISIONS_KEPT);
    expect(
      await server.rows("SELECT used_bytes AS n FROM labs WHERE name = 'kept-one-push'"),
    ).toEqual(
      await server.rows(
        `SELECT sum(octet_length(coalesce(body, '')) + octet_length(device)
                    + octet_length(record_id) + 100) AS n
         FROM revisions JOIN labs ON labs.id = lab_id WHERE labs.name = 'kept-one-push'`,
      ),
    );
  });
});
