/**
 * `npm run bench` (server part): pushes per second and the slowest request with one and with two
 * `rivalplate server start` processes on one database, on SQLite (a data folder) and on
 * PostgreSQL (a throwaway cluster, tests/support/postgres-cluster.ts), all on loopback. Phones
 * (PHONES of them, over LABS labs) each push batches of new plate records in a loop, spread over
 * the processes in turn, for a fixed time after a short warm-up; a phone whose push fails counts
 * the failure and goes on. The load comes from this process, on the same machine as the servers
 * and the database, which takes its share of the cores.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import type { PushResponse } from '../../schema/sync-protocol.ts';
import { openStore } from '../../server/open-store.ts';
import { newToken, tokenHash } from '../../server/tokens.ts';
import { startCluster } from '../support/postgres-cluster.ts';
import { type ChildServer, startChildServer } from '../sync/child-server.ts';
import { changeOf, plate } from '../sync/marrowfield.ts';

/** One push, as the app sends it. */
async function call<T>(url: string, token: string, init: { body: unknown }) {
  const res = await fetch(url, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
    body: JSON.stringify(init.body),
  });
  return { status: res.status, json: (await res.json()) as T };
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

async function measure(where: string, processes: number) {
  const tokens = await labs(where);
  const servers: ChildServer[] = [];
  for (let i = 0; i < processes; i++) servers.push(await startChildServer(where));
  const start = performance.now();
  const measuredFrom = start + WARM_UP_MS;
  const end = measuredFrom + SECONDS * 1000;
  let pushes = 0;
  let failed = 0;
  const times: number[] = [];
  await Promise.all(
    Array.from({ length: PHONES }, async (_, phone) => {
      const token = tokens[phone % LABS]!;
      for (let n = 0; performance.now() < end; n++) {
        const server = servers[(phone + n) % servers.length]!;
        const changes = Array.from({ length: PER_PUSH }, (_, i) =>
          changeOf('plates', plate(`b-${processes}-${phone}-${n}-${i}`)),
        );
        const t0 = performance.now();
        const r = await call<PushResponse>(`${server.sync}/push`, token, {
          body: { device: `phone-${phone}`, changes },
        }).catch(() => null);
        const t1 = performance.now();
        if (t0 < measuredFrom) continue;
        if (r?.status === 200) {
          pushes += 1;
          times.push(t1 - t0);
        } else failed += 1;
      }
    }),
  );
  await Promise.all(servers.map((s) => s.stop()));
  times.sort((a, b) => a - b);
  return {
    'pushes/s': Number((pushes / SECONDS).toFixed(1)),
    'records/s': Math.round((pushes * PER_PUSH) / SECONDS),
    'median ms': Math.round(times[times.length >> 1] ?? 0),
    'p99 ms': Math.round(times[Math.floor(times.length * 0.99)] ?? 0),
    'slowest ms': Math.round(times.at(-1) ?? 0),
    failed,
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
      const r = await measure(where, processes);
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
