import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import {
  analysisToOriginal,
  classifyWithPalette,
  type LearnedModel,
  learnPalette,
  type Palette,
  type PlateAnalysis,
} from '../cv/index.ts';
import { decodePhoto } from './decode-image.ts';
import { loadCvCore } from './opencv-quiet.ts';

type CvCore = Awaited<ReturnType<typeof loadCvCore>>;

export type Outcome =
  | { file: string; analysis: PlateAnalysis; ms: number }
  | { file: string; error: string };

export interface BatchOptions {
  dishMm: number;
  /** Classify against this palette; without it the batch's own palette is learned. */
  palette?: Palette;
  /** Decide colonies (and, when it holds them, colours) with this experiment's learned model. */
  model?: LearnedModel;
  /**
   * Photos read at once, each in a worker thread with its own opencv.js (default: the machine's
   * cores). 1 reads them one after another in this thread. The output is the same either way.
   */
  jobs?: number;
  /** Called as each photo is read, in the order they finish: how many are done, of how many. */
  onPhoto?: (done: number, total: number, file: string) => void;
}

/** What one photo's analysis needs besides the file: the same for every photo of a batch. */
export type PhotoSettings = Pick<BatchOptions, 'dishMm' | 'palette' | 'model'>;

/**
 * Counts a batch of photos the way a lab's batch is counted: every photo is analysed, then, unless
 * a palette was given, the two marker colours are learned from the whole batch's trustworthy
 * colonies and every plate is classified against them. Shared by `count` and `accuracy`, so the
 * scorer measures exactly what the counter reports. With several jobs only the first step (each
 * photo on its own) is spread over worker threads; the palette is learned here from all of them,
 * so `--jobs N` and `--jobs 1` give the same answer. Outcomes come back in the order of `files`.
 * `core` is this thread's cv core, when the caller has it loaded already (used with one job).
 */
export async function countBatch(
  core: CvCore | undefined,
  files: readonly string[],
  options: BatchOptions,
): Promise<{ outcomes: Outcome[]; palette: Palette | undefined }> {
  const settings: PhotoSettings = {
    dishMm: options.dishMm,
    ...(options.palette ? { palette: options.palette } : {}),
    ...(options.model ? { model: options.model } : {}),
  };
  const jobs = Math.max(1, Math.min(options.jobs ?? availableParallelism(), files.length));
  const outcomes =
    jobs === 1
      ? await countHere(core ?? (await loadCvCore()), files, settings, options.onPhoto)
      : await countInWorkers(files, settings, jobs, options.onPhoto);
  let palette = options.palette ?? options.model?.palette ?? undefined;
  if (!palette) {
    const learned = learnPalette(outcomes.flatMap((o) => ('analysis' in o ? [o.analysis] : [])));
    if (learned) {
      palette = learned;
      for (const o of outcomes)
        if ('analysis' in o) o.analysis = classifyWithPalette(o.analysis, learned);
    }
  }
  return { outcomes, palette };
}

async function countHere(
  core: CvCore,
  files: readonly string[],
  settings: PhotoSettings,
  onPhoto: BatchOptions['onPhoto'],
): Promise<Outcome[]> {
  const outcomes: Outcome[] = [];
  for (const [i, file] of files.entries()) {
    outcomes.push(await countOne(core, file, settings));
    onPhoto?.(i + 1, files.length, file);
  }
  return outcomes;
}

const WORKER_ENTRY = new URL('./count-worker.js', import.meta.url);

/** A message from a worker: ready, or the outcome of the photo it was given. */
export type WorkerReply = { ready: true } | { index: number; outcome: Outcome };

/**
 * A pool of `jobs` workers, each given the next photo's name as it finishes the last: only the
 * photos being read are decoded at any moment (one per worker), whatever the batch's size. A
 * worker that dies takes only its photo with it (reported as not counted) and is replaced.
 */
function countInWorkers(
  files: readonly string[],
  settings: PhotoSettings,
  jobs: number,
  onPhoto: BatchOptions['onPhoto'],
): Promise<Outcome[]> {
  const outcomes: Outcome[] = new Array(files.length);
  let next = 0;
  let done = 0;
  return new Promise((resolve, reject) => {
    const workers = new Set<Worker>();
    const finish = (index: number, outcome: Outcome) => {
      outcomes[index] = outcome;
      done++;
      onPhoto?.(done, files.length, outcome.file);
      if (done === files.length) {
        for (const w of workers) void w.terminate();
        resolve(outcomes);
      }
    };
    const start = () => {
      const worker = new Worker(WORKER_ENTRY, { workerData: settings });
      workers.add(worker);
      let current = -1;
      const feed = () => {
        if (next >= files.length) {
          current = -1;
          workers.delete(worker);
          void worker.terminate();
          return;
        }
        current = next++;
        worker.postMessage({ index: current, file: files[current] });
      };
      worker.on('message', (reply: WorkerReply) => {
        if ('index' in reply) finish(reply.index, reply.outcome);
        feed();
      });
      worker.on('error', (e) => {
        workers.delete(worker);
        if (current < 0) return reject(e);
        finish(current, {
          file: files[current]!,
          error: `the worker reading it failed: ${e.message}`,
        });
        if (done < files.length && next < files.length) start();
      });
    };
    for (let i = 0; i < jobs; i++) start();
  });
}

/** One photo decoded and analysed: the same code in this thread and in every worker. */
export async function countOne(
  core: CvCore,
  file: string,
  settings: PhotoSettings,
): Promise<Outcome> {
  try {
    const photo = await decodePhoto(file);
    const started = performance.now();
    const analysis = await core.analyzePlate(photo.pixels, {
      dishDiameterMm: settings.dishMm,
      ...(settings.palette ? { palette: settings.palette } : {}),
      ...(settings.model ? { model: settings.model } : {}),
    });
    // Read from the decoded copy, reported in the photo's own pixels.
    const inPhoto = analysisToOriginal(analysis, 1 / photo.scale, photo.width, photo.height);
    return { file, analysis: inPhoto, ms: performance.now() - started };
  } catch (e) {
    return { file, error: e instanceof Error ? e.message : String(e) };
  }
}
