/**
 * `count --jobs 2` reads photos in this thread and a worker thread: the same records, in the
 * same order, as `--jobs 1` (everything but the time each photo took), a palette learned from
 * the whole batch in both, and a bad file reported in its place.
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writePlate } from '../fixtures/plate-files.ts';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { capturedIo } from './captured-io.ts';
import { main } from './main.ts';

let dir = '';
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'rivalplate-jobs-'));
  for (const seed of [3, 4, 5, 6]) {
    // Seed 5 holds one colour only: classified by the batch's palette, not split in two.
    const colonies: [number, number] = seed === 5 ? [50, 0] : [40, 30];
    const plate = generatePlate({ seed, width: 1600, height: 1200, colonies });
    await writePlate(plate, join(dir, `plate-${seed}.jpg`), { format: 'jpeg' });
  }
  await writeFile(join(dir, 'plate-45-empty.jpg'), '');
}, 60_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function count(jobs: number) {
  const io = capturedIo('.');
  const palette = join(dir, `palette-${jobs}.json`);
  const code = await main(
    ['count', '--json', '--jobs', String(jobs), '--save-palette', palette, dir],
    io,
  );
  const records = io
    .stdout()
    .trim()
    .split('\n')
    .map((l) => {
      const { ms: _ms, ...rest } = JSON.parse(l) as Record<string, unknown>;
      return rest;
    });
  return { code, records, err: io.stderr(), palette: await readFile(palette, 'utf8') };
}

describe('rivalplate count --jobs', () => {
  it('gives with two jobs exactly what one thread gives, in input order', async () => {
    const one = await count(1);
    const two = await count(2);
    expect(one.code).toBe(1); // the empty file
    expect(two.code).toBe(1);
    expect(two.records.map((r) => r.file)).toEqual([
      join(dir, 'plate-3.jpg'),
      join(dir, 'plate-4.jpg'),
      join(dir, 'plate-45-empty.jpg'),
      join(dir, 'plate-5.jpg'),
      join(dir, 'plate-6.jpg'),
    ]);
    expect(two.records[2]).toHaveProperty('error');
    expect(two.records).toEqual(one.records);
    expect(two.palette).toBe(one.palette);
    expect(two.err).toBe(one.err);
    // The one-colour plate is sorted by the batch's palette: (nearly) all in one class.
    const single = two.records[3] as { colonies: { cls: number }[] };
    const inClass0 = single.colonies.filter((c) => c.cls === 0).length;
    expect(Math.max(inClass0, single.colonies.length - inClass0)).toBeGreaterThan(
      0.9 * single.colonies.length,
    );
  }, 180_000);

  it('refuses a number of jobs below 1', async () => {
    const io = capturedIo('.');
    expect(await main(['count', '--jobs', '0', dir], io)).toBe(2);
    expect(io.stderr()).toContain('--jobs');
  });
});
