/**
 * Faults on the way between a phone and the server: connections cut in the middle of a push and
 * of a photo chunk, an answer that never arrives, and the server process killed (SIGKILL) while a
 * batch is being applied, then started again on the same database (the SQLite file, or the
 * PostgreSQL database: this suite runs on both engines). After each, what the client sent is
 * counted against what the server holds: nothing lost, nothing twice.
 */
import { createHash, randomBytes } from 'node:crypto';
import { request } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  Change,
  PhotoUploadState,
  PullResponse,
  PushResponse,
} from '../../schema/sync-protocol.ts';
import { pushArrives, pushStarted, startChildServer } from './child-server.ts';
import { call, freePort, startTestServer, type TestServer } from './harness.ts';
import { analysis, benchSession, changeOf } from './marrowfield.ts';
import { makePhone } from './phone.ts';
import { dropDatabase, ENGINE, freshDatabase, queryOnce } from './test-database.ts';

const tally = { faults: 0, synced: 0, lost: 0, duplicated: 0 };

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
  console.log(
    `sync faults: ${tally.faults} faults injected, ${tally.synced} records synced, ` +
      `${tally.lost} records lost, ${tally.duplicated} duplicated`,
  );
});

/**
 * Sends `body` with its full Content-Length but only the first `sendBytes` of it (all of it when
 * omitted), then cuts the connection: before the answer, like a phone walking out of the network.
 */
function cutRequest(
  url: string,
  token: string,
  body: Buffer,
  type: string,
  method: string,
  sendBytes = body.length,
): Promise<void> {
  return new Promise((done) => {
    const req = request(url, {
      method,
      headers: {
        authorization: `Bearer ${token}`,
        'content-type': type,
        'content-length': body.length,
      },
    });
    req.on('error', () => done());
    req.on('close', () => done());
    req.write(body.subarray(0, sendBytes), () => {
      // Give the server a moment to read what was sent, so the cut lands mid-request.
      setTimeout(() => req.destroy(), 30);
    });
    tally.faults += 1;
  });
}

/** Counts the client's changes against the server's records: missing ones and extra revisions. */
async function audit(sync: string, token: string, sent: Change[]): Promise<void> {
  const found = new Map<string, number>();
  let cursor = '0';
  for (;;) {
    const { json } = await call<PullResponse>(`${sync}/changes?since=${cursor}`, token);
    for (const r of json.records) found.set(`${r.kind}/${r.id}`, r.heads.length);
    cursor = json.cursor;
    if (!json.more) break;
  }
  const lost = sent.filter((c) => !found.has(`${c.kind}/${c.id}`)).length;
  const duplicated = [...found.values()].filter((heads) => heads !== 1).length;
  tally.lost += lost;
  tally.duplicated += duplicated;
  tally.synced += sent.length - lost;
  expect({ lost, duplicated, records: found.size }).toEqual({
    lost: 0,
    duplicated: 0,
    records: sent.length,
  });
}

const revisions = async (srv: TestServer) =>
  ((await srv.rows('SELECT count(*) AS n FROM revisions'))[0] as { n: number }).n;

describe('connection cut', () => {
  it('in the middle of a push: nothing is written, and the retry stores the whole batch', async () => {
    const token = await server.lab('cut-push');
    const changes = benchSession(40, 'cut-plate');
    const body = Buffer.from(JSON.stringify({ device: 'phone-a', changes }));
    const before = await revisions(server);
    await cutRequest(
      `${server.sync}/push`,
      token,
      body,
      'application/json',
      'POST',
      body.length >> 1,
    );
    expect(await revisions(server)).toBe(before);
    const retry = await call<PushResponse>(`${server.sync}/push`, token, {
      body: { device: 'phone-a', changes },
    });
    expect(retry.json.accepted).toHaveLength(changes.length);
    await audit(server.sync, token, changes);
  });

  it('after the push arrived but before its answer: the retry is a repeat, not a copy', async () => {
    const token = await server.lab('lost-answer');
    const changes = benchSession(30, 'lost-plate');
    const body = Buffer.from(JSON.stringify({ device: 'phone-a', changes }));
    await cutRequest(`${server.sync}/push`, token, body, 'application/json', 'POST');
    const retry = await call<PushResponse>(`${server.sync}/push`, token, {
      body: { device: 'phone-a', changes },
    });
    expect(retry.status).toBe(200);
    expect(retry.json.accepted).toHaveLength(changes.length);
    await audit(server.sync, token, changes);
    const stored = (
      await server.rows("SELECT count(*) AS n FROM revisions WHERE record_id LIKE 'lost-plate-%'")
    )[0] as { n: number };
    expect(stored.n).toBe(30);
  });

  it('in the middle of a photo chunk: the upload resumes from the bytes the server holds', async () => {
    const token = await server.lab('cut-photo');
    const photo = randomBytes(600_000);
    const sha = createHash('sha256').update(photo).digest('hex');
    await call(`${server.sync}/photos`, token, {
      body: {
        photoId: 'mf-photo-cut',
        plateId: 'mf-plate-1',
        bytes: photo.length,
        type: 'image/jpeg',
        sha256: sha,
      },
    });
    const chunk = 256 * 1024;
    await call(`${server.sync}/photos/mf-photo-cut?offset=0`, token, {
      method: 'PUT',
      raw: photo.subarray(0, chunk),
      type: 'application/octet-stream',
    });
    await cutRequest(
      `${server.sync}/photos/mf-photo-cut?offset=${chunk}`,
      token,
      photo.subarray(chunk, 2 * chunk),
      'application/octet-stream',
      'PUT',
      chunk >> 1,
    );
    // Resume the way the client does: ask where the upload stands, send from there.
    let state = (await call<PhotoUploadState>(`${server.sync}/photos/mf-photo-cut/upload`, token))
      .json;
    expect(state.received).toBe(chunk);
    while (!state.complete) {
      const r = await call<PhotoUploadState>(
        `${server.sync}/photos/mf-photo-cut?offset=${state.received}`,
        token,
        {
          method: 'PUT',
          raw: photo.subarray(state.received, state.received + chunk),
          type: 'application/octet-stream',
        },
      );
      expect(r.status).toBe(200);
      state = r.json;
    }
    const back = await fetch(`${server.sync}/photos/mf-photo-cut`, {
      headers: { authorization: `Bearer ${token}` },
    });
    expect(
      createHash('sha256')
        .update(Buffer.from(await back.arrayBuffer()))
        .digest('hex'),
    ).toBe(sha);
  });
});

describe('server process killed during a batch', () => {
  it('leaves each batch wholly there or wholly absent; after a restart the retry completes it', async () => {
    const dir = await freshDatabase();
    const first = await startTestServer({ dir });
    const token = await first.lab('killed');
    await first.close();

    // Dense analyses (150 of 200 colonies, about 6 MB) keep the server busy long enough with the
    // batch to be killed while it works on it.
    const outcomes: string[] = [];
    const everything: Change[] = [];
    // Killed as the push arrives, as the server starts applying it, and just after it answered.
    const killAt = ['as the push arrives', 'as the server applies it', 'after the answer'] as const;
    // Each restarted server takes the retry and then the next round's batch.
    let child = await startChildServer(dir);
    for (const [index, moment] of killAt.entries()) {
      const round = index + 1;
      const changes = Array.from({ length: 150 }, (_, i) =>
        changeOf('analyses', analysis(`kill-${round}-${i}`, `mf-plate-${i}`, 200)),
      );
      everything.push(...changes);
      const logged =
        moment === 'after the answer'
          ? null
          : child.nextLog(moment === 'as the push arrives' ? pushArrives : pushStarted);
      const sending = call(`${child.sync}/push`, token, {
        body: { device: 'phone-a', changes },
      }).catch(() => null);
      await (logged ?? sending);
      await child.kill();
      tally.faults += 1;
      await sending;

      // The database as the crash left it, opened again: intact, and the batch all or nothing.
      if (ENGINE === 'sqlite')
        expect(await queryOnce(dir, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }]);
      const [{ n }] = (await queryOnce(
        dir,
        'SELECT count(*) AS n FROM revisions WHERE record_id LIKE ?',
        `kill-${round}-%`,
      )) as [{ n: number }];
      expect([0, 150]).toContain(n);
      if (moment === 'after the answer') expect(n).toBe(150);
      outcomes.push(`${n === 0 ? 'absent' : 'whole'} (killed at "${moment}")`);

      child = await startChildServer(dir);
      const retry = await call<PushResponse>(`${child.sync}/push`, token, {
        body: { device: 'phone-a', changes },
      });
      expect(retry.json.accepted).toHaveLength(150);
      expect(retry.json.accepted.every((r) => r.repeat)).toBe(n === 150);
    }
    await audit(child.sync, token, everything);
    await child.stop();
    await dropDatabase(dir);
    console.log(
      `server killed ${killAt.length} times: the batch was ${outcomes.join(', ')} after each restart`,
    );
  });
});

describe('server process killed as a photo completes', () => {
  const CHUNK = 1024 * 1024;

  /** Announces the photo and sends chunks from where the server stands, as the client does. */
  async function sendFrom(sync: string, token: string, id: string, photo: Buffer, upTo: number) {
    const sha256 = createHash('sha256').update(photo).digest('hex');
    let state = (
      await call<PhotoUploadState>(`${sync}/photos`, token, {
        body: {
          photoId: id,
          plateId: 'mf-plate-1',
          bytes: photo.length,
          type: 'image/jpeg',
          sha256,
        },
      })
    ).json;
    while (!state.complete && state.received < upTo) {
      const r = await call<PhotoUploadState>(
        `${sync}/photos/${id}?offset=${state.received}`,
        token,
        {
          method: 'PUT',
          raw: photo.subarray(state.received, state.received + CHUNK),
          type: 'application/octet-stream',
        },
      );
      expect(r.status, JSON.stringify(r.json)).toBe(200);
      state = r.json;
    }
    return state;
  }

  async function fetched(sync: string, token: string, id: string): Promise<string> {
    const res = await fetch(`${sync}/photos/${id}`, {
      headers: { authorization: `Bearer ${token}` },
    });
    expect(res.status).toBe(200);
    return createHash('sha256')
      .update(Buffer.from(await res.arrayBuffer()))
      .digest('hex');
  }

  it('leaves the upload complete or resumable, never all bytes in and unfinished', async () => {
    const dir = await freshDatabase();
    const setup = await startTestServer({ dir });
    const token = await setup.lab('photo-kill', { photoMaxBytes: 64 * CHUNK });
    await setup.close();
    let child = await startChildServer(dir);
    // Killed at moments spread over the last chunk's handling: its arrival, the write, the check.
    const delays = [0, 3, 6, 10, 16, 30];
    const outcomes = { complete: 0, resumed: 0 };
    for (const [i, delay] of delays.entries()) {
      const photo = randomBytes(16 * CHUNK);
      const id = `mf-photo-kill-${i}`;
      const last = photo.length - CHUNK;
      await sendFrom(child.sync, token, id, photo, last);
      const arrived = child.nextLog(
        (line) =>
          line.msg === 'incoming request' &&
          line.req?.url === `/sync/v1/photos/${id}?offset=${last}`,
      );
      const sending = call(`${child.sync}/photos/${id}?offset=${last}`, token, {
        method: 'PUT',
        raw: photo.subarray(last),
        type: 'application/octet-stream',
      }).catch(() => null);
      await arrived;
      await new Promise((r) => setTimeout(r, delay));
      await child.kill();
      tally.faults += 1;
      await sending;

      child = await startChildServer(dir);
      const state = (await call<PhotoUploadState>(`${child.sync}/photos/${id}/upload`, token)).json;
      // The one state a client cannot get past: every byte in, and not complete.
      expect(state.complete || state.received < state.bytes, JSON.stringify(state)).toBe(true);
      if (state.complete) outcomes.complete += 1;
      else outcomes.resumed += 1;
      const done = await sendFrom(child.sync, token, id, photo, photo.length);
      expect(done.complete).toBe(true);
      expect(await fetched(child.sync, token, id)).toBe(
        createHash('sha256').update(photo).digest('hex'),
      );
    }
    await child.stop();
    await dropDatabase(dir);
    console.log(
      `photo upload killed ${delays.length} times at its last chunk: ${outcomes.complete} complete, ${outcomes.resumed} resumed after the restart`,
    );
  });

  it('finishes an upload an older server left with every byte in and not complete', async () => {
    const dir = await freshDatabase();
    const first = await startTestServer({ dir });
    const token = await first.lab('photo-stuck');
    const photo = randomBytes(3 * CHUNK);
    expect(
      (await sendFrom(first.sync, token, 'mf-photo-stuck', photo, photo.length)).complete,
    ).toBe(true);
    await first.close();
    // The state a crash between the last chunk and the check left behind.
    await queryOnce(dir, "UPDATE uploads SET complete = 0 WHERE photo_id = 'mf-photo-stuck'");

    const again = await startTestServer({ dir });
    const state = await sendFrom(again.sync, token, 'mf-photo-stuck', photo, photo.length);
    expect(state).toMatchObject({ complete: true, received: photo.length });
    expect(await fetched(again.sync, token, 'mf-photo-stuck')).toBe(
      createHash('sha256').update(photo).digest('hex'),
    );
    await again.close();
    await dropDatabase(dir);
  });
});

describe('the sync client when the server dies under it', () => {
  it('keeps its outbox through the crash, and its own next round completes the push', async () => {
    const dir = await freshDatabase();
    const setup = await startTestServer({ dir });
    const token = await setup.lab('client-retry');
    await setup.close();
    const port = await freePort();
    let child = await startChildServer(dir, port);

    const phone = await makePhone('crash-phone');
    expect(await phone.client.connect({ serverUrl: `http://127.0.0.1:${port}`, token })).toBeNull();
    const analyses = Array.from({ length: 120 }, (_, i) =>
      analysis(`crash-an-${i}`, `mf-plate-${i}`, 200),
    );
    await phone.records.putBatch({ analyses });
    expect(phone.client.status().waiting).toBe(120);

    // Killed as the push arrives: the server dies before it can answer.
    const arrived = child.nextLog(pushArrives);
    const round = phone.client.syncNow();
    await arrived;
    await child.kill();
    tally.faults += 1;
    const during = await round;
    expect(during).toMatchObject({
      phase: 'retrying',
      waiting: 120,
      problem: { code: 'unreachable' },
    });

    child = await startChildServer(dir, port);
    const after = await phone.client.syncNow();
    expect(after).toMatchObject({ phase: 'idle', waiting: 0, problem: null });
    await audit(
      `http://127.0.0.1:${port}/sync/v1`,
      token,
      analyses.map((a) => changeOf('analyses', a)),
    );
    phone.client.stop();
    await child.stop();
    await dropDatabase(dir);
  });
});
