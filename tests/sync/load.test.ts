/**
 * Many phones at once against one server process on loopback: each pushes its plates in batches
 * and pulls what the others sent, concurrently. Bounded in size (a fixed amount of work) and in
 * time (the run is abandoned, and fails, past its deadline). Reports throughput and the slowest
 * request; asserts no errors and every record on the server and on every phone.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Change, PullResponse, PushResponse } from '../../schema/sync-protocol.ts';
import { type ChildServer, startChildServer } from './child-server.ts';
import { startTestServer } from './harness.ts';
import { changeOf, plate } from './marrowfield.ts';
import { dropDatabase, freshDatabase } from './test-database.ts';

const PHONES = 12;
const ROUNDS = 6;
const PER_PUSH = 25;
const DEADLINE_MS = 30_000;

let child: ChildServer;
let token: string;
let dir: string;
beforeAll(async () => {
  dir = await freshDatabase();
  const setup = await startTestServer({ dir });
  token = await setup.lab('load');
  await setup.close();
  child = await startChildServer(dir);
});
afterAll(async () => {
  await child.stop();
  await dropDatabase(dir);
});

interface Timed<T> {
  status: number;
  json: T;
  ms: number;
}

async function timed<T>(url: string, signal: AbortSignal, body?: unknown): Promise<Timed<T>> {
  const t0 = performance.now();
  const res = await fetch(url, {
    method: body ? 'POST' : 'GET',
    headers: {
      authorization: `Bearer ${token}`,
      ...(body ? { 'content-type': 'application/json' } : {}),
    },
    body: body ? JSON.stringify(body) : undefined,
    signal,
  });
  const json = (await res.json()) as T;
  return { status: res.status, json, ms: performance.now() - t0 };
}

interface Phone {
  seen: Set<string>;
  /** Pulls everything new since this phone's cursor. */
  pullAll(): Promise<void>;
}

/** One phone: push a batch, pull everything new, ROUNDS times. */
async function phone(
  n: number,
  signal: AbortSignal,
  times: number[],
  errors: string[],
): Promise<Phone> {
  const seen = new Set<string>();
  let cursor = '0';
  const pullAll = async () => {
    for (;;) {
      const r = await timed<PullResponse>(`${child.sync}/changes?since=${cursor}`, signal);
      times.push(r.ms);
      if (r.status !== 200) errors.push(`phone ${n} pull: ${r.status} ${JSON.stringify(r.json)}`);
      for (const rec of r.json.records) seen.add(rec.id);
      cursor = r.json.cursor;
      if (!r.json.more) return;
    }
  };
  for (let round = 0; round < ROUNDS; round++) {
    const changes: Change[] = Array.from({ length: PER_PUSH }, (_, i) =>
      changeOf(
        'plates',
        plate(`load-p${n}-r${round}-${i}`, { typedCounts: { test: i, reference: n } }),
      ),
    );
    const r = await timed<PushResponse>(`${child.sync}/push`, signal, {
      device: `phone-${n}`,
      changes,
    });
    times.push(r.ms);
    if (r.status !== 200 || r.json.accepted.length !== PER_PUSH)
      errors.push(`phone ${n} push: ${r.status} ${JSON.stringify(r.json).slice(0, 200)}`);
    await pullAll();
  }
  return { seen, pullAll };
}

describe('load: many phones at once', () => {
  it('syncs every record to the server and to every phone, with no errors, within the deadline', async () => {
    const signal = AbortSignal.timeout(DEADLINE_MS);
    const times: number[] = [];
    const errors: string[] = [];
    const t0 = performance.now();
    const phones = await Promise.all(
      Array.from({ length: PHONES }, (_, n) => phone(n, signal, times, errors)),
    );
    // The phones that finished early missed the last pushes of the others: one more pull each,
    // as their next sync would do.
    await Promise.all(phones.map((p) => p.pullAll()));
    const seconds = (performance.now() - t0) / 1000;
    const expected = PHONES * ROUNDS * PER_PUSH;
    const lost = Math.max(...phones.map((p) => expected - p.seen.size));
    const sorted = [...times].sort((a, b) => a - b);
    console.log(
      `sync load: ${PHONES} phones, ${expected} records synced in ${seconds.toFixed(1)} s ` +
        `(${Math.round(expected / seconds)} records/s, ${times.length} requests), ` +
        `median request ${sorted[sorted.length >> 1]!.toFixed(0)} ms, slowest ${sorted.at(-1)!.toFixed(0)} ms, ` +
        `${errors.length} errors, ${lost} records lost on any phone`,
    );
    expect(errors).toEqual([]);
    expect(lost).toBe(0);
    for (const p of phones) expect(p.seen.size).toBe(expected);
  });
});
