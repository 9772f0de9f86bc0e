import type { LearnedModel, Palette, PlateAnalysis } from '../cv/index.ts';
import { decodePhoto } from './decode-image.ts';
import type { loadCvCore } from './opencv-quiet.ts';

type CvCore = Awaited<ReturnType<typeof loadCvCore>>;

export type Original = { width: number; height: number; decodedScale: number };
export type Outcome =
  | { file: string; analysis: PlateAnalysis; original: Original; ms: number }
  | { file: string; error: string };

export interface BatchOptions {
  dishMm: number;
  /** Classify against this palette; without it the batch's own palette is learned. */
  palette?: Palette;
  /** Decide colonies (and, when it holds them, colours) with this experiment's learned model. */
  model?: LearnedModel;
  /** Called before each photo with its place in the batch (1-based). */
  onPhoto?: (index: number, total: number, file: string) => void;
}

/**
 * Counts a batch of photos the way a lab's batch is counted: every photo is analysed, then, unless
 * a palette was given, the two marker colours are learned from the whole batch's trustworthy
 * colonies and every plate is classified against them. Shared by `count` and `accuracy`, so the
 * scorer measures exactly what the counter reports.
 */
export async function countBatch(
  core: CvCore,
  files: readonly string[],
  options: BatchOptions,
): Promise<{ outcomes: Outcome[]; palette: Palette | undefined }> {
  const outcomes: Outcome[] = [];
  for (const [i, file] of files.entries()) {
    options.onPhoto?.(i + 1, files.length, file);
    outcomes.push(await countOne(core, file, options));
  }
  let palette = options.palette ?? options.model?.palette ?? undefined;
  if (!palette) {
    const learned = core.learnPalette(
      outcomes.flatMap((o) => ('analysis' in o ? [o.analysis] : [])),
    );
    if (learned) {
      palette = learned;
      for (const o of outcomes)
        if ('analysis' in o) o.analysis = core.classifyWithPalette(o.analysis, learned);
    }
  }
  return { outcomes, palette };
}

async function countOne(core: CvCore, file: string, options: BatchOptions): Promise<Outcome> {
  try {
    const photo = await decodePhoto(file);
    const started = performance.now();
    const analysis = await core.analyzePlate(photo.pixels, {
      dishDiameterMm: options.dishMm,
      ...(options.palette ? { palette: options.palette } : {}),
      ...(options.model ? { model: options.model } : {}),
    });
    const original = { width: photo.width, height: photo.height, decodedScale: photo.scale };
    return { file, analysis, original, ms: performance.now() - started };
  } catch (e) {
    return { file, error: e instanceof Error ? e.message : String(e) };
  }
}
