import {
  analysisToOriginal,
  type LearnedModel,
  type Palette,
  type PlateAnalysis,
} from '../cv/index.ts';
import { decodePhoto } from './decode-image.ts';
import type { CvCore } from './opencv-quiet.ts';

export type Outcome =
  | { file: string; analysis: PlateAnalysis; ms: number }
  | { file: string; error: string };

/** What one photo's analysis needs besides the file: the same for every photo of a batch. */
export interface PhotoSettings {
  dishMm: number;
  /** Classify against this palette; without it the batch's own palette is learned. */
  palette?: Palette;
  /** Decide colonies (and, when it holds them, colours) with this experiment's learned model. */
  model?: LearnedModel;
  /** Scale each dish found by this factor (a check of the analysis: see AnalyzeOptions). */
  dishScale?: number;
}

/** One photo decoded and analysed: the same code in every thread of a batch. */
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
      ...(settings.dishScale !== undefined ? { dishScale: settings.dishScale } : {}),
    });
    // Read from the decoded copy, reported in the photo's own pixels.
    const inPhoto = analysisToOriginal(analysis, 1 / photo.scale, photo.width, photo.height);
    return { file, analysis: inPhoto, ms: performance.now() - started };
  } catch (e) {
    return { file, error: e instanceof Error ? e.message : String(e) };
  }
}
