/**
 * A hostile client against a real server over HTTP on loopback with a real SQLite file: text that
 * is not valid Unicode, fields past their byte limits, more heads than a pull may carry, answers
 * that would outgrow a page, malformed addresses, offsets and times. Every bad input must get a
 * 4xx in the protocol's `{ error, message }` shape, and the lab must still pull cleanly after.
 */
import { request } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  type Change,
  checkErrorBody,
  checkPullResponse,
  type PushResponse,
  SYNC_LIMITS,
} from '../../schema/sync-protocol.ts';
import { call, startTestServer, type TestServer } from './harness.ts';
import { at, benchSession, changeOf, experiment, plate } from './marrowfield.ts';

const tally = { tried: 0, refused: 0, serverFaults: 0, resets: 0 };

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
  console.log(
    `sync bad input: ${tally.tried} bad inputs tried, ${tally.refused} refused in the protocol's shape, ` +
      `5xx ${tally.serverFaults}, connection resets ${tally.resets}`,
  );
});

interface RawAnswer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  text: string;
}

/** One request over node:http, the path sent exactly as given (fetch would normalise it). */
function raw(
  path: string,
  init: { method?: string; token?: string; body?: Buffer; type?: string } = {},
): Promise<RawAnswer | 'reset'> {
  const url = new URL(server.origin);
  return new Promise((done) => {
    const req = request(
      {
        host: url.hostname,
        port: url.port,
        path,
        method: init.method ?? (init.body ? 'POST' : 'GET'),
        headers: {
          ...(init.token ? { authorization: `Bearer ${init.token}` } : {}),
          ...(init.body
            ? {
                'content-type': init.type ?? 'application/json',
                'content-length': init.body.length,
              }
            : {}),
        },
      },
      (res) => {
        const parts: Buffer[] = [];
        res.on('data', (d: Buffer) => parts.push(d));
        res.on('end', () =>
          done({
            status: res.statusCode ?? 0,
            headers: res.headers,
            text: Buffer.concat(parts).toString(),
          }),
        );
        res.on('error', () => done('reset'));
      },
    );
    req.on('error', () => done('reset'));
    req.end(init.body);
  });
}

/** Sends one bad input and checks the refusal: its status, code, and the protocol's shape. */
async function refused(
  answer: RawAnswer | 'reset',
  status: number,
  error: string,
  message?: RegExp,
): Promise<string> {
  tally.tried += 1;
  if (answer === 'reset') {
    tally.resets += 1;
    throw new Error(`expected ${status} ${error}, the connection was reset`);
  }
  if (answer.status >= 500) tally.serverFaults += 1;
  const body = checkErrorBody(JSON.parse(answer.text), 'answer');
  expect({ status: answer.status, error: body.error }).toEqual({ status, error });
  if (message) expect(body.message).toMatch(message);
  tally.refused += 1;
  return body.message;
}

const json = (value: unknown) => Buffer.from(JSON.stringify(value));
const pushRaw = (token: string, body: unknown) => raw('/sync/v1/push', { token, body: json(body) });

/** Every page from the start: each passes the client's own check and keeps to the byte budget. */
async function pullAll(token: string): Promise<{ pages: number[]; records: number }> {
  const pages: number[] = [];
  let records = 0;
  let cursor = '0';
  for (;;) {
    const answer = await raw(`/sync/v1/changes?since=${cursor}`, { token });
    if (answer === 'reset') throw new Error('pull reset');
    expect(answer.status).toBe(200);
    const page = checkPullResponse(JSON.parse(answer.text), 'answer');
    const bytes = Buffer.byteLength(answer.text);
    if (page.records.length > 1) expect(bytes).toBeLessThanOrEqual(SYNC_LIMITS.pullBytes);
    pages.push(bytes);
    records += page.records.length;
    cursor = page.cursor;
    if (!page.more) return { pages, records };
  }
}

describe('text that is not valid Unicode', () => {
  it('a lone surrogate in an id, a device or a name is refused, and the lab pulls on', async () => {
    const token = await server.lab('surrogates');
    await pushRaw(token, { device: 'phone-a', changes: benchSession(2) });
    const bad = { ...experiment('mf-exp-\ud800'), name: 'Marrowfield' };
    await refused(
      await pushRaw(token, { device: 'phone-a', changes: [changeOf('experiments', bad)] }),
      400,
      'invalid-request',
      /\.id: is not valid Unicode text/,
    );
    await refused(
      await pushRaw(token, { device: '\udc00phone', changes: benchSession(1) }),
      400,
      'invalid-request',
      /body\.device: is not valid Unicode/,
    );
    const badName = { ...experiment(), revision: 2, name: 'pond \udbff' };
    await refused(
      await pushRaw(token, { device: 'phone-a', changes: [changeOf('experiments', badName)] }),
      400,
      'invalid-request',
      /body\.name: is not valid Unicode/,
    );
    await refused(
      await raw('/sync/v1/photos', {
        token,
        body: json({
          photoId: 'p\ud800',
          plateId: 'mf-plate-1',
          bytes: 10,
          type: 'image/jpeg',
          sha256: 'a'.repeat(64),
        }),
      }),
      400,
      'invalid-request',
      /photoId: is not valid Unicode/,
    );
    // A valid pair (an emoji) is fine.
    const emoji = { ...experiment('mf-exp-🧫'), name: 'Marrowfield 🧫' };
    const ok = await pushRaw(token, {
      device: 'phone-🧫',
      changes: [changeOf('experiments', emoji)],
    });
    expect(ok !== 'reset' && ok.status).toBe(200);
    expect((await pullAll(token)).records).toBe(7);
  });
});

describe('lengths in bytes', () => {
  it('refuses a device id, a record id and a name past their limits, counting UTF-8 bytes', async () => {
    const token = await server.lab('lengths');
    await refused(
      await pushRaw(token, { device: 'd'.repeat(1024 * 1024), changes: benchSession(1) }),
      400,
      'invalid-request',
      /body\.device: is 1048576 bytes long in UTF-8; at most 512/,
    );
    const longId = 'i'.repeat(512 * 1024);
    await refused(
      await pushRaw(token, {
        device: 'phone-a',
        changes: [changeOf('plates', plate(longId))],
      }),
      400,
      'invalid-request',
      /\.id: is 524288 bytes long in UTF-8; at most 128/,
    );
    const message = await refused(
      await pushRaw(token, {
        device: 'phone-a',
        changes: [changeOf('experiments', { ...experiment(), name: 'n'.repeat(2 * 1024 * 1024) })],
      }),
      400,
      'invalid-request',
      /\.body\.name: is 2097152 bytes long in UTF-8; at most 512/,
    );
    // The refusal names the field without echoing the two megabytes.
    expect(message.length).toBeLessThan(300);
    // 170 three-byte characters (510 bytes) fit; 171 (513 bytes) do not.
    const name = (n: number) => '池'.repeat(n);
    const fits = await pushRaw(token, {
      device: name(170),
      changes: [changeOf('experiments', { ...experiment(), name: name(170) })],
    });
    expect(fits !== 'reset' && fits.status).toBe(200);
    await refused(
      await pushRaw(token, {
        device: name(171),
        changes: [changeOf('experiments', { ...experiment(), revision: 2, name: name(170) })],
      }),
      400,
      'invalid-request',
      /is 513 bytes long/,
    );
    expect(await server.rows("SELECT count(*) AS n FROM revisions WHERE device LIKE 'd%'")).toEqual(
      [{ n: 0 }],
    );
  });
});

describe('heads per record', () => {
  it('refuses the revision that would make one head more than a pull may carry', async () => {
    const token = await server.lab('heads');
    const versions = (n: number, from = 0) =>
      Array.from({ length: n }, (_, i) =>
        changeOf('plates', { ...plate('mf-plate-1'), volumeUl: 100 + from + i }),
      );
    const cap = SYNC_LIMITS.headsPerRecord;
    await refused(
      await pushRaw(token, { device: 'phone-a', changes: versions(cap + 1) }),
      409,
      'too-many-heads',
      /plates mf-plate-1 already has 64 versions/,
    );
    const stored = async () =>
      await server.rows(
        "SELECT count(*) AS n FROM revisions JOIN labs ON labs.id = lab_id WHERE labs.name = 'heads'",
      );
    expect(await stored()).toEqual([{ n: 0 }]);
    const full = await call<PushResponse>(`${server.sync}/push`, token, {
      body: { device: 'phone-a', changes: versions(cap) },
    });
    // The first was the only head when it landed; each one after it added a head.
    const heads = [...full.json.accepted, ...full.json.conflicts].map((r) => r.hash);
    expect(new Set(heads).size).toBe(cap);
    await refused(
      await pushRaw(token, { device: 'phone-b', changes: versions(1, cap) }),
      409,
      'too-many-heads',
    );
    // Every page still passes the client's check (at most 64 heads).
    expect((await pullAll(token)).records).toBe(1);
    // A resolution replaces them all, and the record is down to one head.
    const resolution: Change = {
      ...changeOf('plates', { ...plate('mf-plate-1'), revision: 2, updatedAt: at(30) }),
      replaces: heads,
    };
    const settled = await call<PushResponse>(`${server.sync}/push`, token, {
      body: { device: 'phone-a', changes: [resolution] },
    });
    expect(settled.json.accepted).toHaveLength(1);
  });
});

describe('pull pages in bytes', () => {
  it('keeps every page within the budget, counting device ids and text in any script', async () => {
    const token = await server.lab('page-bytes');
    // Names at the limit in three-byte characters, from phones with long device ids: each record
    // is about three times larger in bytes than in characters.
    const line = (i: number) => `${i}${'池'.repeat(160)}`;
    const lines = Array.from({ length: 20 }, (_, i) => line(i));
    for (let batch = 0; batch < 3; batch++) {
      const changes = Array.from({ length: 200 }, (_, i) =>
        changeOf('experiments', {
          ...experiment(`mf-exp-${batch}-${i}`),
          name: line(i),
          lines,
          referenceName: line(99),
        }),
      );
      const answer = await pushRaw(token, { device: '端'.repeat(170), changes });
      expect(answer !== 'reset' && answer.status).toBe(200);
    }
    const { pages, records } = await pullAll(token);
    expect(records).toBe(600);
    expect(pages.length).toBeGreaterThan(1);
    console.log(
      `sync pull pages: ${records} records in ${pages.length} pages, largest ${Math.max(...pages)} bytes (budget ${SYNC_LIMITS.pullBytes})`,
    );
  });
});

describe('addresses, offsets and times', () => {
  it('a malformed %-escape in the address is refused in the protocol shape', async () => {
    const token = await server.lab('bad-url');
    await refused(
      await raw('/sync/v1/changes%E0%A4%A', { token }),
      400,
      'invalid-request',
      /not valid/,
    );
    await refused(await raw('/sync/v1/photos/%C0%AF', { token }), 400, 'invalid-request');
  });

  it('chunk offsets are decimal digits only', async () => {
    const token = await server.lab('offsets');
    for (const offset of ['', '0x10', '1e3', '-1', '1.0', '+1', ' 1']) {
      await refused(
        await raw(`/sync/v1/photos/mf-photo?offset=${encodeURIComponent(offset)}`, {
          method: 'PUT',
          token,
          body: Buffer.alloc(10),
          type: 'application/octet-stream',
        }),
        400,
        'invalid-request',
        /query\.offset: expected a byte offset in decimal digits/,
      );
    }
  });

  it('times are UTC in the one form the app writes, and real dates', async () => {
    const token = await server.lab('times');
    for (const updatedAt of [
      '2026-03-02',
      '2026-03-02T09:00:00Z',
      '2026-03-02T10:00:00.000+01:00',
      'March 2, 2026',
      '2026-02-30T09:00:00.000Z',
    ]) {
      await refused(
        await pushRaw(token, {
          device: 'phone-a',
          changes: [{ ...changeOf('plates', { ...plate('p1'), updatedAt }), updatedAt }],
        }),
        400,
        'invalid-request',
        /updatedAt: expected a UTC time as YYYY-MM-DDTHH:MM:SS\.sssZ/,
      );
    }
  });

  it('a not-found answer quotes only a short start of the address', async () => {
    const long = `/sync/v1/${'a'.repeat(8000)}`;
    const message = await refused(await raw(long), 404, 'not-found');
    expect(message.length).toBeLessThan(120);
  });

  it('without a built app, the not-found answer does not name the server folder', async () => {
    const missing = `/tmp/rivalplate-no-app-${process.pid}`;
    const bare = await startTestServer({ appDir: missing });
    try {
      const res = await fetch(`${bare.origin}/index.html`);
      tally.tried += 1;
      expect(res.status).toBe(404);
      const text = await res.text();
      expect(text).not.toContain(missing);
      expect(checkErrorBody(JSON.parse(text), 'answer').error).toBe('not-found');
      tally.refused += 1;
    } finally {
      await bare.close();
    }
  });
});

describe('headers and oversized bodies', () => {
  it('answers carrying lab data are never cached or sniffed', async () => {
    const token = await server.lab('headers');
    await pushRaw(token, { device: 'phone-a', changes: benchSession(1) });
    for (const path of ['/sync/v1/lab', '/sync/v1/changes?since=0', '/sync/v1/photos/none']) {
      const answer = await raw(path, { token });
      if (answer === 'reset') throw new Error('reset');
      expect(answer.headers['x-content-type-options'], path).toBe('nosniff');
      expect(answer.headers['cache-control'], path).toBe('no-store');
    }
    const refusal = await raw('/sync/v1/lab');
    expect(refusal !== 'reset' && refusal.headers['x-content-type-options']).toBe('nosniff');
  });

  it('a whole 9 MiB push gets its 413, not a reset connection', async () => {
    const token = await server.lab('nine-mib');
    const body = json({
      device: 'phone-a',
      changes: benchSession(1),
      padding: 'x'.repeat(9 << 20),
    });
    // Sent as a phone on a slow network sends it: a megabyte at a time, with pauses.
    const answer = await new Promise<RawAnswer | 'reset'>((done) => {
      const url = new URL(server.sync);
      const req = request({
        host: url.hostname,
        port: url.port,
        path: '/sync/v1/push',
        method: 'POST',
        headers: {
          authorization: `Bearer ${token}`,
          'content-type': 'application/json',
          'content-length': body.length,
        },
      });
      req.on('response', (res) => {
        const parts: Buffer[] = [];
        res.on('data', (d: Buffer) => parts.push(d));
        res.on('end', () =>
          done({
            status: res.statusCode ?? 0,
            headers: res.headers,
            text: String(Buffer.concat(parts)),
          }),
        );
      });
      req.on('error', () => done('reset'));
      const send = (from: number) => {
        if (from >= body.length) return void req.end();
        req.write(body.subarray(from, from + (1 << 20)), () =>
          setTimeout(() => send(from + (1 << 20)), 20),
        );
      };
      send(0);
    });
    await refused(answer, 413, 'too-large');
  });
});
