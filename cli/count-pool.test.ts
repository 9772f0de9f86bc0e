/**
 * The pool behind `count --jobs N`: N threads read photos, this one and N − 1 workers, each
 * taking the next photo from one shared queue; every photo is read exactly once and the
 * outcomes come back in the order of the files.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { writePlate } from '../fixtures/plate-files.ts';
import { generatePlate } from '../fixtures/plate-generator.ts';
import type { Outcome } from './count-one.ts';
import { countInPool, PhotoQueue } from './count-pool.ts';
import { loadCvCore } from './opencv-quiet.ts';

const started = vi.hoisted(() => ({ workers: 0 }));
vi.mock('node:worker_threads', async (importOriginal) => {
  const real = await importOriginal<typeof import('node:worker_threads')>();
  class CountedWorker extends real.Worker {
    constructor(...args: ConstructorParameters<typeof real.Worker>) {
      super(...args);
      started.workers++;
    }
  }
  return { ...real, Worker: CountedWorker };
});

describe('PhotoQueue', () => {
  it('hands out every photo once, records what each worker took, and stops when closed', () => {
    const queue = PhotoQueue.forWorkers(3, 2);
    // A worker's view of the same memory, as count-worker.ts makes it.
    const inWorker = new PhotoQueue(3, queue.shared);
    queue.release(0);
    queue.release(1);
    expect(queue.heldBy(0)).toBe(-2);
    expect(queue.hasMore()).toBe(true);
    expect(queue.take()).toBe(0);
    expect(inWorker.take(1)).toBe(1);
    expect(queue.heldBy(1)).toBe(1);
    expect(inWorker.take(0)).toBe(2);
    expect(queue.take()).toBe(-1);
    expect(queue.hasMore()).toBe(false);
    expect(inWorker.take(1)).toBe(-1);
    expect(queue.heldBy(1)).toBe(-1);
    const closed = PhotoQueue.forWorkers(5, 1);
    closed.close();
    expect(closed.take(0)).toBe(-1);
  });
});

let dir = '';
const files: string[] = [];
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'rivalplate-pool-'));
  for (const seed of [11, 12, 13]) {
    const plate = generatePlate({ seed, width: 1000, height: 750, colonies: [25, 20] });
    files.push(join(dir, `plate-${seed}.jpg`));
    await writePlate(plate, files.at(-1)!, { format: 'jpeg' });
  }
  files.splice(1, 0, join(dir, 'not-a-photo.jpg'));
  await writeFile(files[1]!, 'text, not a JPEG');
}, 60_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** An outcome with everything but how long the photo and each stage took. */
function strip(o: Outcome) {
  return 'analysis' in o ? { file: o.file, analysis: { ...o.analysis, timings: {} } } : o;
}

describe('countInPool', () => {
  it('reads with this thread and jobs − 1 workers the same outcomes as this thread alone', async () => {
    const loads = vi.fn(loadCvCore);
    const progress: number[] = [];
    started.workers = 0;
    const alone = await countInPool(loads, files, { dishMm: 90 }, 1);
    expect(started.workers).toBe(0);
    const two = await countInPool(loads, files, { dishMm: 90 }, 2, (done) => progress.push(done));
    expect(started.workers).toBe(1); // jobs 2: this thread and one worker
    expect(loads).toHaveBeenCalledTimes(2); // once per call, in this thread
    expect(progress).toEqual([1, 2, 3, 4]);
    expect(two.map((o) => o.file)).toEqual(files);
    expect(two[1]).toHaveProperty('error');
    expect(two.map(strip)).toEqual(alone.map(strip));
  }, 120_000);

  it('reports the photo a worker stopped on, and a new worker reads the rest', async () => {
    const crash = join(dir, 'crash-plate.jpg');
    await writeFile(crash, 'never read');
    const batch = [crash, ...files, crash.replace('crash-plate', 'crash-again')];
    await writeFile(batch.at(-1)!, 'never read');
    const alone = await countInPool(loadCvCore, files, { dishMm: 90 }, 1);
    started.workers = 0;
    // This thread starts reading only once the first worker has stopped (its replacement is
    // started), so the photo it stopped on was the worker's.
    const slowCore = async () => {
      while (started.workers < 2) await new Promise((r) => setTimeout(r, 20));
      return loadCvCore();
    };
    const entry = new URL('../tests/support/failing-count-worker.js', import.meta.url);
    const outcomes = await countInPool(slowCore, batch, { dishMm: 90 }, 2, undefined, entry);
    expect(outcomes.map((o) => o.file)).toEqual(batch);
    expect(outcomes[0]).toEqual({
      file: crash,
      error: `the worker reading it failed: stopped on ${crash}`,
    });
    expect(outcomes.slice(1, -1).map(strip)).toEqual(alone.map(strip));
  }, 120_000);
});
