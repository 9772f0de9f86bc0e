/**
 * Two server processes on one database (PostgreSQL's reason to be here; SQLite's file is shared
 * the same way, one writer at a time). Pushes for the same records reach both at the same moment:
 * the heads end as one process would leave them, no revision is stored twice, and a phone pulling
 * all along never has a record skipped by its cursor. Then, on PostgreSQL, faults: phones
 * alternate between the two processes while one is killed with SIGKILL in the middle of a batch
 * and the database itself is restarted once; what the phones sent is counted against what the
 * server holds.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Change, PullResponse, PushResponse } from '../../schema/sync-protocol.ts';
import { newToken, tokenHash } from '../../server/tokens.ts';
import { type Cluster, startCluster } from '../support/postgres-cluster.ts';
import { type ChildServer, pushStarted, startChildServer } from './child-server.ts';
import { call, freePort } from './harness.ts';
import { analysis, changeOf, plate, revised } from './marrowfield.ts';
import {
  dropDatabase,
  ENGINE,
  freshDatabase,
  openTestStore,
  queryOnce,
  withDatabase,
} from './test-database.ts';

/** A lab and a token on `where`, made through the store as the command line makes them. */
async function labOn(where: string, name: string): Promise<string> {
  const store = await openTestStore(where);
  try {
    const lab =
      (await store.findLab(name)) ??
      (await store.addLab(name, { photosEnabled: true, photoMaxBytes: 4 << 20 }));
    const token = newToken();
    await store.addToken(lab.id, tokenHash(token));
    return token;
  } finally {
    await store.close();
  }
}

const push = (sync: string, token: string, device: string, changes: Change[]) =>
  call<PushResponse>(`${sync}/push`, token, { body: { device, changes } });

/** Every record of the lab by its heads (hashes, sorted), pulled page by page from the start. */
async function headsOf(sync: string, token: string): Promise<Map<string, string[]>> {
  const found = new Map<string, string[]>();
  let cursor = '0';
  for (;;) {
    const { json } = await call<PullResponse>(`${sync}/changes?since=${cursor}&limit=50`, token);
    for (const r of json.records) found.set(`${r.kind}/${r.id}`, r.heads.map((h) => h.hash).sort());
    cursor = json.cursor;
    if (!json.more) return found;
  }
}

describe(`two server processes on one ${ENGINE} database`, () => {
  let where: string;
  let a: ChildServer;
  let b: ChildServer;
  beforeAll(async () => {
    where = await freshDatabase();
    await labOn(where, 'setup'); // the schema is made before both start
    [a, b] = await Promise.all([startChildServer(where), startChildServer(where)]);
  });
  afterAll(async () => {
    await Promise.all([a?.stop(), b?.stop()]);
    await dropDatabase(where);
  });

  it('end with the heads one process leaves when both take pushes for the same records at once', async () => {
    const token = await labOn(where, 'same-records');
    const reference = await labOn(where, 'one-process');
    const RECORDS = 30;
    const base = Array.from({ length: RECORDS }, (_, i) => plate(`mf-race-${i}`));
    const first = await push(
      a.sync,
      token,
      'phone-0',
      base.map((p) => changeOf('plates', p)),
    );
    await push(
      a.sync,
      reference,
      'phone-0',
      base.map((p) => changeOf('plates', p)),
    );
    const h0 = first.json.accepted.map((r) => r.hash);
    // Phone A and phone B each edit every plate on top of the same head; phone A's batch also
    // goes to the second process (a retry that crossed the first): a repeat, not a copy.
    const editsA = base.map((p, i) =>
      changeOf('plates', revised(p, { reviewed: true }, 5), [h0[i]!]),
    );
    const editsB = base.map((p, i) =>
      changeOf('plates', revised(p, { volumeUl: 50 }, 6), [h0[i]!]),
    );
    const racing = await Promise.all([
      push(a.sync, token, 'phone-a', editsA),
      push(b.sync, token, 'phone-b', editsB),
      push(b.sync, token, 'phone-a', editsA),
    ]);
    expect(racing.map((r) => r.status)).toEqual([200, 200, 200]);
    // The same pushes one after another through one process.
    await push(a.sync, reference, 'phone-a', editsA);
    await push(a.sync, reference, 'phone-b', editsB);
    await push(a.sync, reference, 'phone-a', editsA);

    const raced = await headsOf(a.sync, token);
    const alone = await headsOf(a.sync, reference);
    expect(raced.size).toBe(RECORDS);
    expect(raced).toEqual(alone);
    for (const heads of raced.values()) expect(heads).toHaveLength(2);
    const [{ n }] = (await queryOnce(
      where,
      "SELECT count(*) AS n FROM revisions JOIN labs ON labs.id = lab_id WHERE labs.name = 'same-records'",
    )) as [{ n: number }];
    expect(n).toBe(3 * RECORDS);
  });

  it('never lets a pull cursor pass a record committed later with a smaller sequence number', async () => {
    const token = await labOn(where, 'cursor');
    const ROUNDS = 12;
    const PER_PUSH = 10;
    const seen = new Set<string>();
    let cursor = '0';
    let pushing = true;
    const pulling = (async () => {
      // A phone pulling from the first process as fast as it can while both take pushes.
      while (pushing) {
        const { json } = await call<PullResponse>(
          `${a.sync}/changes?since=${cursor}&limit=7`,
          token,
        );
        for (const r of json.records) seen.add(r.id);
        cursor = json.cursor;
      }
    })();
    const sent: string[] = [];
    for (let round = 0; round < ROUNDS; round++) {
      await Promise.all(
        [a, b].map((server, s) => {
          const changes = Array.from({ length: PER_PUSH }, (_, i) =>
            changeOf('analyses', analysis(`cur-${round}-${s}-${i}`, `mf-plate-${i}`, 20)),
          );
          sent.push(...changes.map((c) => c.id));
          return push(server.sync, token, `phone-${s}`, changes).then((r) =>
            expect(r.status, JSON.stringify(r.json)).toBe(200),
          );
        }),
      );
    }
    pushing = false;
    await pulling;
    // The pulling phone goes on from its cursor: what it has not seen must come now.
    for (;;) {
      const { json } = await call<PullResponse>(`${b.sync}/changes?since=${cursor}`, token);
      for (const r of json.records) seen.add(r.id);
      cursor = json.cursor;
      if (!json.more) break;
    }
    expect(sent.filter((id) => !seen.has(id))).toEqual([]);
    expect(seen.size).toBe(ROUNDS * 2 * PER_PUSH);
  });
});

describe.runIf(ENGINE === 'postgres')('faults with two server processes on PostgreSQL', () => {
  let cluster: Cluster;
  beforeAll(async () => {
    // A cluster of its own: this test restarts it, which the other test files must not feel.
    cluster = await startCluster();
  });
  afterAll(() => cluster?.stop());

  it('phones alternating between them lose nothing and store nothing twice through a kill and a database restart', async () => {
    const where = withDatabase(cluster.url, 'postgres');
    const token = await labOn(where, 'faults');
    const ports = [await freePort(), await freePort()];
    const servers = await Promise.all(ports.map((p) => startChildServer(where, p)));
    const PHONES = 4;
    const ROUNDS = 6;
    const PER_PUSH = 40;
    const tally = { pushes: 0, retries: 0, kills: 0, restarts: 0 };
    const sent: Change[] = [];

    /** A phone's push: retried, on the other process each time, until it is answered. */
    async function pushLikeAPhone(phone: number, round: number, changes: Change[]) {
      for (let attempt = 0; attempt < 100; attempt++) {
        const server = servers[(phone + round + attempt) % 2]!;
        const r = await push(server.sync, token, `phone-${phone}`, changes).catch(() => null);
        if (r?.status === 200) {
          expect(r.json.accepted.length + r.json.conflicts.length).toBe(changes.length);
          return;
        }
        tally.retries += 1;
        await new Promise((done) => setTimeout(done, 150));
      }
      throw new Error(`phone ${phone} could not push round ${round}`);
    }

    for (let round = 0; round < ROUNDS; round++) {
      const batches = Array.from({ length: PHONES }, (_, phone) =>
        Array.from({ length: PER_PUSH }, (_, i) =>
          changeOf('analyses', analysis(`ft-${phone}-${round}-${i}`, `mf-plate-${i}`, 120)),
        ),
      );
      for (const batch of batches) sent.push(...batch);
      // Round 2: the first process is killed as it applies a batch, and started again.
      const killing =
        round === 2
          ? servers[0]!.nextLog(pushStarted).then(async () => {
              await servers[0]!.kill();
              tally.kills += 1;
              servers[0] = await startChildServer(where, ports[0]);
            })
          : null;
      const pushing = Promise.all(
        batches.map((batch, phone) => pushLikeAPhone(phone, round, batch)),
      );
      // Round 4: the database goes down (immediate stop, as a crash) and comes back under load.
      if (round === 4) {
        await new Promise((done) => setTimeout(done, 40));
        cluster.restart();
        tally.restarts += 1;
      }
      await pushing;
      await killing;
      tally.pushes += PHONES;
    }

    const heads = await headsOf(servers[1]!.sync, token);
    const lost = sent.filter((c) => !heads.has(`${c.kind}/${c.id}`)).length;
    const [{ n: stored }] = (await queryOnce(
      where,
      "SELECT count(*) AS n FROM revisions JOIN labs ON labs.id = lab_id WHERE labs.name = 'faults'",
    )) as [{ n: number }];
    const duplicated =
      [...heads.values()].filter((h) => h.length !== 1).length + (stored - heads.size);
    console.log(
      `two servers on PostgreSQL: ${tally.pushes} pushes from ${PHONES} phones alternating, ` +
        `${tally.kills} server killed mid-batch, database restarted ${tally.restarts} time, ` +
        `${tally.retries} retries: ${heads.size} records synced, ${lost} lost, ${duplicated} duplicated`,
    );
    expect({ kills: tally.kills, restarts: tally.restarts }).toEqual({ kills: 1, restarts: 1 });
    expect({ lost, duplicated, records: heads.size }).toEqual({
      lost: 0,
      duplicated: 0,
      records: sent.length,
    });
    await Promise.all(servers.map((s) => s.stop()));
  }, 120_000);
});
