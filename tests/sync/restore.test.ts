/**
 * The server's database put back from a copy, as the README tells an operator to keep one: the
 * phones hold cursors past the end of the copy, and records pushed since the copy get numbers the
 * phones believe they have seen. Phones must notice, pull from the start, and push again what
 * the copy lacks: in the end the server and every phone hold every record once.
 */
import { copyFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { RecordKind } from '../../schema/records.ts';
import type { PullResponse } from '../../schema/sync-protocol.ts';
import { DATABASE_FILE } from '../../server/data-folder.ts';
import type { RecordStore } from '../../web/storage/record-store.ts';
import { call, freePort, startTestServer, type TestServer, tempDir } from './harness.ts';
import { assay, experiment, plate, revised, sample } from './marrowfield.ts';
import { makePhone, type Phone } from './phone.ts';

const tally = { restores: 0, synced: 0, lost: 0, duplicated: 0 };
afterAll(() => {
  console.log(
    `sync restore: ${tally.restores} restore(s) from a copy, ${tally.synced} records synced, ` +
      `${tally.lost} records lost, ${tally.duplicated} duplicated`,
  );
});

const KINDS: RecordKind[] = ['experiments', 'assays', 'samples', 'plates'];

async function holdings(records: RecordStore): Promise<Map<string, number>> {
  const out = new Map<string, number>();
  for (const kind of KINDS)
    for (const r of await records.all(kind)) out.set(`${kind}/${r.id}`, r.revision);
  return out;
}

/** What the server holds: each record's heads' revisions. */
async function serverHoldings(sync: string, token: string): Promise<Map<string, number[]>> {
  const out = new Map<string, number[]>();
  let cursor = '0';
  for (;;) {
    const { json } = await call<PullResponse>(`${sync}/changes?since=${cursor}`, token);
    for (const r of json.records)
      out.set(
        `${r.kind}/${r.id}`,
        r.heads.map((h) => h.revision),
      );
    cursor = json.cursor;
    if (!json.more) return out;
  }
}

async function synced(...phones: Phone[]): Promise<void> {
  for (const p of phones) expect((await p.client.syncNow()).problem).toBeNull();
}

describe('the server database restored from a copy', () => {
  it('phones pull from the start and push again what the copy lacks: nothing lost, nothing twice', async () => {
    const dir = tempDir();
    const port = await freePort();
    const file = join(dir, DATABASE_FILE);
    let server: TestServer = await startTestServer({ dir, port });
    const token = await server.lab('restored');
    const serverUrl = `http://127.0.0.1:${port}`;

    const a = await makePhone('restore-a');
    const b = await makePhone('restore-b');
    for (const p of [a, b]) expect(await p.client.connect({ serverUrl, token })).toBeNull();
    const plate1 = plate('mf-plate-1');
    await a.records.putBatch({
      experiments: [experiment()],
      assays: [assay('mf-L1-r1')],
      samples: [sample('mf-L1-r1-start', 'mf-L1-r1')],
      plates: [plate1, plate('mf-plate-2')],
    });
    await synced(a, b);

    // The operator's copy, taken while the server is stopped.
    await server.close();
    copyFileSync(file, join(dir, 'copy.sqlite'));
    server = await startTestServer({ dir, port });

    // Work after the copy: an edit and new plates from both phones, all confirmed by the server.
    await a.records.put('plates', revised(plate1, { volumeUl: 50 }, 40));
    await a.records.put('plates', plate('mf-plate-3'));
    await b.records.put('plates', plate('mf-plate-4'));
    await b.records.putBatch({ plates: Array.from({ length: 5 }, (_, i) => plate(`mf-b-${i}`)) });
    await synced(a, b, a);

    // The disk fails; the copy is put back while the server is stopped.
    await server.close();
    copyFileSync(join(dir, 'copy.sqlite'), file);
    for (const extra of ['-wal', '-shm']) rmSync(file + extra, { force: true });
    tally.restores += 1;
    server = await startTestServer({ dir, port });

    // A new phone pushes first, so the restored database numbers its records where the phones'
    // cursors already point.
    const c = await makePhone('restore-c');
    expect(await c.client.connect({ serverUrl, token })).toBeNull();
    await c.records.putBatch({
      plates: Array.from({ length: 12 }, (_, i) => plate(`mf-c-${i}`)),
    });
    await synced(c, a, b, c, a, b);

    const onServer = await serverHoldings(server.sync, token);
    const expected = new Map<string, number>([
      ...(await holdings(a.records)),
      ...(await holdings(b.records)),
      ...(await holdings(c.records)),
    ]);
    let lost = 0;
    let duplicated = 0;
    for (const [key, revision] of expected) {
      const heads = onServer.get(key);
      if (!heads) lost += 1;
      else if (heads.length !== 1 || heads[0] !== revision) duplicated += 1;
    }
    for (const p of [a, b, c]) {
      const held = await holdings(p.records);
      lost += [...expected.keys()].filter((k) => !held.has(k)).length;
    }
    tally.lost += lost;
    tally.duplicated += duplicated;
    tally.synced += expected.size;
    expect({ lost, duplicated, records: onServer.size }).toEqual({
      lost: 0,
      duplicated: 0,
      records: 3 + 2 + 2 + 5 + 12,
    });
    // The edit made after the copy survived on the server, not the copy's older revision.
    expect(onServer.get('plates/mf-plate-1')).toEqual([2]);
    for (const p of [a, b, c]) p.client.stop();
    await server.close();
    rmSync(dir, { recursive: true, force: true });
  });
});
