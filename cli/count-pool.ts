import { Worker } from 'node:worker_threads';
import { countOne, type Outcome, type PhotoSettings } from './count-one.ts';
import type { CvCore } from './opencv-quiet.ts';

/** In a worker's slot: it has taken no photo since it started. */
const NONE_YET = -2;

/**
 * Which photo each thread of a batch reads next, shared by all of them in one SharedArrayBuffer:
 * slot 0 is the next photo's index, slot 1 + k the photo worker k took last. A thread that
 * finishes a photo takes the next one itself, with no round trip through this thread, so a
 * worker never waits while this thread is busy analysing a photo of its own.
 */
export class PhotoQueue {
  readonly slots: Int32Array;

  /** A queue of `size` photos over `shared`: a new one (see `forWorkers`), or a worker's view. */
  constructor(
    readonly size: number,
    readonly shared: SharedArrayBuffer,
  ) {
    this.slots = new Int32Array(shared);
  }

  static forWorkers(size: number, workers: number): PhotoQueue {
    return new PhotoQueue(
      size,
      new SharedArrayBuffer(Int32Array.BYTES_PER_ELEMENT * (1 + workers)),
    );
  }

  /** The next photo for worker `slot` (none: this thread), or −1 when there are none left. */
  take(slot?: number): number {
    const index = Atomics.add(this.slots, 0, 1);
    const taken = index < this.size ? index : -1;
    if (slot !== undefined) Atomics.store(this.slots, 1 + slot, taken);
    return taken;
  }

  /** Worker `slot` (re)starts holding nothing. */
  release(slot: number): void {
    Atomics.store(this.slots, 1 + slot, NONE_YET);
  }

  /** The photo worker `slot` took last (it may have answered for it), −1, or NONE_YET. */
  heldBy(slot: number): number {
    return Atomics.load(this.slots, 1 + slot);
  }

  /** Whether any photo is still to be taken. */
  hasMore(): boolean {
    return Atomics.load(this.slots, 0) < this.size;
  }

  /** No thread takes another photo: the batch is over. */
  close(): void {
    Atomics.store(this.slots, 0, this.size);
  }
}

/** What a worker is started with. */
export interface WorkerInput {
  files: readonly string[];
  settings: PhotoSettings;
  queue: SharedArrayBuffer;
  slot: number;
}

/** A worker's message: the outcome of a photo it took. */
export interface WorkerReply {
  index: number;
  outcome: Outcome;
}

const WORKER_ENTRY = new URL('./count-worker.js', import.meta.url);

/** What the pool's workers share with this thread. */
interface Pool {
  entry: URL;
  input: Omit<WorkerInput, 'slot'>;
  queue: PhotoQueue;
  finish: (index: number, outcome: Outcome) => void;
  fail: (e: Error) => void;
  /** Set once the batch is over: workers stopped from here on are not replaced. */
  closed: boolean;
}

/**
 * Reads `files` in this thread and in `jobs − 1` worker threads at once, each with its own
 * opencv.js, each taking the next photo from a shared queue as it finishes the last: only the
 * photos being read are decoded at any moment (one per thread), whatever the batch's size. The
 * workers start first, so their opencv.js loads while `loadCore` loads this thread's. A worker that
 * dies takes only its photo with it (reported as not counted) and is replaced while photos
 * remain to be taken. Outcomes come back in the order of `files`; `onPhoto` is called as each is known.
 */
export async function countInPool(
  loadCore: () => Promise<CvCore>,
  files: readonly string[],
  settings: PhotoSettings,
  jobs: number,
  onPhoto?: (done: number, total: number, file: string) => void,
  /** The workers' script: another one only in tests of a worker that fails. */
  entry: URL = WORKER_ENTRY,
): Promise<Outcome[]> {
  const queue = PhotoQueue.forWorkers(files.length, jobs - 1);
  const outcomes: Outcome[] = new Array(files.length);
  let done = 0;
  let allDone = () => {};
  const finished = new Promise<void>((resolve) => {
    allDone = resolve;
  });
  let fail: (e: Error) => void = () => {};
  const failed = new Promise<never>((_, reject) => {
    fail = reject;
  });
  failed.catch(() => {}); // awaited below, once this thread has no photo left
  const pool: Pool = {
    entry,
    input: { files, settings, queue: queue.shared },
    queue,
    finish: (index, outcome) => {
      if (outcomes[index]) return; // a worker that stopped right after answering for it
      outcomes[index] = outcome;
      done++;
      onPhoto?.(done, files.length, outcome.file);
      if (done === files.length) allDone();
    },
    fail: (e) => {
      queue.close();
      fail(e);
    },
    closed: false,
  };
  const workers = new Set<Worker>();
  const start = (slot: number) => workers.add(startWorker(pool, slot, start));
  for (let slot = 0; slot < jobs - 1; slot++) start(slot);
  try {
    const here = await loadCore();
    for (let i = queue.take(); i >= 0; i = queue.take()) {
      pool.finish(i, await countOne(here, files[i]!, settings));
    }
    if (done < files.length) await Promise.race([finished, failed]);
    return outcomes;
  } finally {
    pool.closed = true;
    queue.close();
    await Promise.all([...workers].map((w) => w.terminate()));
  }
}

/**
 * Worker `slot` of the pool. Its outcomes arrive as messages; when it stops (an uncaught error, or
 * opencv.js aborting), the photo it held is reported as not counted and a new worker takes its
 * place. A worker that stops before taking any photo cannot start at all: the batch fails.
 */
function startWorker(pool: Pool, slot: number, restart: (slot: number) => void): Worker {
  pool.queue.release(slot);
  const worker = new Worker(pool.entry, { workerData: { ...pool.input, slot } });
  let error: Error | undefined;
  worker.on('message', (reply: WorkerReply) => pool.finish(reply.index, reply.outcome));
  worker.on('error', (e) => {
    error = e;
  });
  // 'exit' comes after every message the worker sent, so a photo it answered for is not lost.
  worker.on('exit', (code) => {
    if (pool.closed) return;
    const held = pool.queue.heldBy(slot);
    const why = error?.message ?? `exit code ${code}`;
    if (held === NONE_YET) return pool.fail(new Error(`a counting worker could not start: ${why}`));
    if (held < 0) return; // it found the queue empty: its work is done
    pool.finish(held, {
      file: pool.input.files[held]!,
      error: `the worker reading it failed: ${why}`,
    });
    if (pool.queue.hasMore()) restart(slot);
  });
  return worker;
}
