/**
 * `npm run bench` (server part): pushes per second and the slowest request with one and with two
 * `rivalplate server start` processes on one database, on SQLite (a data folder) and on
 * PostgreSQL (a throwaway cluster, tests/support/postgres-cluster.ts), all on loopback. Phones
 * (PHONES of them, over LABS labs) each push batches of new plate records in a loop, spread over
 * the processes in turn, for a fixed time after a short warm-up; a phone whose push fails counts
 * the failure and goes on. The load comes from this process, on the same machine as the servers
 * and the database, which takes its share of the cores: the CPU each part spent per push (load,
 * servers, database) is shown beside the throughput, with what other work on the machine took.
 */

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { Agent, request } from 'node:http';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { openStore } from '../../server/open-store.ts';
import { newToken, tokenHash } from '../../server/tokens.ts';
import { type Cluster, startCluster } from '../support/postgres-cluster.ts';
import { type ChildServer, startChildServer } from '../sync/child-server.ts';
import { changeOf, plate } from '../sync/marrowfield.ts';
import { cpuSeconds, machineBusySeconds, withChildren } from './process-cpu.ts';

/**
 * The load is kept cheap, so that what the benchmark measures is the servers: one keep-alive
 * connection per phone and server (as a phone's browser keeps its connection), and each phone's
 * push body serialised once as a template, only the push's number written into its record ids.
 */
const agent = new Agent({ keepAlive: true, maxSockets: 64 });

/** One push: its HTTP status, or null when the request failed. */
function push(url: URL, token: string, body: string): Promise<number | null> {
  return new Promise((done) => {
    const req = request(
      url,
      {
        method: 'POST',
        agent,
        headers: {
          authorization: `Bearer ${token}`,
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(body),
        },
      },
      (res) => {
        res.resume(); // the answer's receipts are not needed here, only that it came whole
        res.once('end', () => done(res.statusCode ?? null));
        res.once('error', () => done(null));
      },
    );
    req.once('error', () => done(null));
    req.end(body);
  });
}

/** Where the push number goes in a template. */
const PUSH_NUMBER = '\u0000n\u0000';

/** A phone's push bodies: `body(n)` is its n-th push, PER_PUSH new plate records. */
function pushBodies(processes: number, phone: number): (n: number) => string {
  const changes = Array.from({ length: PER_PUSH }, (_, i) =>
    changeOf('plates', plate(`b-${processes}-${phone}-${PUSH_NUMBER}-${i}`)),
  );
  const parts = JSON.stringify({ device: `phone-${phone}`, changes }).split(
    JSON.stringify(PUSH_NUMBER).slice(1, -1),
  );
  return (n) => parts.join(String(n));
}

const SECONDS = Number(process.env.RIVALPLATE_BENCH_SECONDS ?? 8);
const WARM_UP_MS = 1500;
const PHONES = 8;
const LABS = 4;
const PER_PUSH = 20;

async function labs(where: string): Promise<string[]> {
  const { store } = await openStore(
    where.startsWith('postgres') ? { dataDir: '', db: where } : { dataDir: where },
  );
  const tokens: string[] = [];
  for (let i = 0; i < LABS; i++) {
    const lab = await store.addLab(`bench-${i}`, { photosEnabled: true, photoMaxBytes: 4 << 20 });
    const token = newToken();
    await store.addToken(lab.id, tokenHash(token));
    tokens.push(token);
  }
  await store.close();
  return tokens;
}

/**
 * CPU seconds so far of this process (the load), the servers, the database, and the whole
 * machine (so what other work took meanwhile can be told apart).
 */
function cpuNow(servers: readonly ChildServer[], database: () => number[]) {
  const own = process.cpuUsage();
  return {
    machine: machineBusySeconds(),
    load: (own.user + own.system) / 1e6,
    servers: cpuSeconds(servers.map((s) => s.process.pid!)),
    database: cpuSeconds(database()),
  };
}

/** PostgreSQL's postmaster and its backends, or nothing for SQLite (in the server process). */
function databaseProcesses(cluster: Cluster, where: string): () => number[] {
  if (!where.startsWith('postgres')) return () => [];
  const postmaster = Number(
    readFileSync(join(cluster.dir, 'data', 'postmaster.pid'), 'utf8').split('\n')[0],
  );
  return () => withChildren(postmaster);
}

async function measure(where: string, processes: number, database: () => number[]) {
  const tokens = await labs(where);
  const servers: ChildServer[] = [];
  for (let i = 0; i < processes; i++) servers.push(await startChildServer(where));
  const urls = servers.map((s) => new URL(`${s.sync}/push`));
  const start = performance.now();
  const measuredFrom = start + WARM_UP_MS;
  const end = measuredFrom + SECONDS * 1000;
  let pushes = 0;
  let failed = 0;
  let cpuFrom = cpuNow(servers, database);
  const warmedUp = setTimeout(() => {
    cpuFrom = cpuNow(servers, database);
  }, WARM_UP_MS);
  const times: number[] = [];
  await Promise.all(
    Array.from({ length: PHONES }, async (_, phone) => {
      const token = tokens[phone % LABS]!;
      const body = pushBodies(processes, phone);
      for (let n = 0; performance.now() < end; n++) {
        const url = urls[(phone + n) % urls.length]!;
        const t0 = performance.now();
        const status = await push(url, token, body(n));
        const t1 = performance.now();
        if (t0 < measuredFrom) continue;
        if (status === 200) {
          pushes += 1;
          times.push(t1 - t0);
        } else failed += 1;
      }
    }),
  );
  clearTimeout(warmedUp);
  const cpuTo = cpuNow(servers, database);
  await Promise.all(servers.map((s) => s.stop()));
  times.sort((a, b) => a - b);
  // CPU per push, in ms, over the measured time (the warm-up excluded, and the few pushes still
  // in flight at its ends counted with the time).
  const spent = (part: keyof typeof cpuTo) => cpuTo[part] - cpuFrom[part];
  const perPush = (part: keyof typeof cpuTo) =>
    Number(((spent(part) * 1000) / Math.max(1, pushes)).toFixed(2));
  const ours = spent('load') + spent('servers') + spent('database');
  return {
    'pushes/s': Number((pushes / SECONDS).toFixed(1)),
    'records/s': Math.round((pushes * PER_PUSH) / SECONDS),
    'median ms': Math.round(times[times.length >> 1] ?? 0),
    'p99 ms': Math.round(times[Math.floor(times.length * 0.99)] ?? 0),
    'slowest ms': Math.round(times.at(-1) ?? 0),
    failed,
    'CPU ms/push load': perPush('load'),
    servers: perPush('servers'),
    database: perPush('database'),
    // The cores the benchmark's own processes got, and those other work on the machine took.
    'cores used': Number((ours / SECONDS).toFixed(2)),
    'others took': Number(((spent('machine') - ours) / SECONDS).toFixed(2)),
  };
}

const rows: Record<string, string | number>[] = [];
const cluster = await startCluster();
try {
  for (const engine of ['sqlite', 'postgres'] as const) {
    let oneProcess = 0;
    for (const processes of [1, 2]) {
      const dir = mkdtempSync(join(tmpdir(), 'rivalplate-bench-'));
      const where =
        engine === 'sqlite' ? dir : cluster.url.replace(/\/postgres$/, `/bench_${processes}`);
      if (engine === 'postgres') {
        const { default: pg } = await import('pg');
        const admin = new pg.Client({ connectionString: cluster.url });
        await admin.connect();
        await admin.query(`CREATE DATABASE bench_${processes}`);
        await admin.end();
      }
      const r = await measure(where, processes, databaseProcesses(cluster, where));
      if (processes === 1) oneProcess = r['pushes/s'];
      rows.push({
        engine,
        processes,
        ...r,
        'vs 1 process': Number((r['pushes/s'] / oneProcess).toFixed(2)),
      });
      rmSync(dir, { recursive: true, force: true });
    }
  }
} finally {
  cluster.stop();
}
console.log(
  `Sync server: ${PHONES} phones over ${LABS} labs pushing ${PER_PUSH} plates a push for ${SECONDS} s (after ${WARM_UP_MS / 1000} s warm-up), loopback, ${availableParallelism()} cores shared with the load and the database, load average ${loadavg()[0]!.toFixed(1)} at the end`,
);
console.table(rows);
