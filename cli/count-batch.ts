import { availableParallelism } from 'node:os';
import { classifyWithPalette, learnPalette, type Palette } from '../cv/index.ts';
import type { Outcome, PhotoSettings } from './count-one.ts';
import { countInPool } from './count-pool.ts';
import { type CvCore, loadCvCore } from './opencv-quiet.ts';

export type { Outcome, PhotoSettings } from './count-one.ts';

export interface BatchOptions extends PhotoSettings {
  /**
   * Photos read at once, each by a thread with its own opencv.js (default: the machine's cores):
   * this thread and jobs − 1 worker threads. 1 reads them one after another in this thread. The
   * output is the same either way.
   */
  jobs?: number;
  /** Called as each photo is read, in the order they finish: how many are done, of how many. */
  onPhoto?: (done: number, total: number, file: string) => void;
}

/**
 * Counts a batch of photos the way a lab's batch is counted: every photo is analysed, then, unless
 * a palette was given, the two marker colours are learned from the whole batch's trustworthy
 * colonies and every plate is classified against them. Shared by `count` and `accuracy`, so the
 * scorer measures exactly what the counter reports. With several jobs only the first step (each
 * photo on its own) is shared with worker threads; the palette is learned here from all of
 * them, so `--jobs N` and `--jobs 1` give the same answer. Outcomes come back in the order of
 * `files`. `core` is this thread's cv core, when the caller has it loaded already.
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
    ...(options.dishScale !== undefined ? { dishScale: options.dishScale } : {}),
  };
  const jobs = Math.max(1, Math.min(options.jobs ?? availableParallelism(), files.length));
  const outcomes = await countInPool(
    core ? () => Promise.resolve(core) : loadCvCore,
    files,
    settings,
    jobs,
    options.onPhoto,
  );
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
