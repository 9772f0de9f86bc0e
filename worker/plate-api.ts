/**
 * What the plate-analysis worker offers: a thin adapter that decodes a photo, runs the cv/ core on
 * it and hands results back in original photo pixels. It holds no state between calls except the
 * opencv.js runtime, so the app may terminate it at any time (abort, idle) and start another.
 * plate-worker.ts exposes it; tests expose it on a MessageChannel.
 */
import {
  analyzePlate,
  classifyWithPalette,
  learnPalette,
  paletteFromExamples,
} from '../cv/index.ts';
import { loadOpenCv } from '../cv/opencv.ts';
import { analysisToOriginal, dishToDecoded } from '../cv/photo-pixels.ts';
import type { AnalyzeOptions, Colony, LearnedModel, Palette, PlateAnalysis } from '../cv/types.ts';
import { decodePhoto } from './decode.ts';
import { type FitResult, fitExperimentModel, type TeachingPlate } from './learning.ts';

export interface AnalyseRequest {
  photo: Blob;
  /** File name, for error messages. */
  name: string;
  palette?: Palette;
  /** A dish placed by the person, in original photo pixels. */
  dish?: AnalyzeOptions['dish'];
  /** The experiment's learned model (read with learning.ts's readModelText); absent: the defaults. */
  model?: LearnedModel;
}

export interface AnalyseResult {
  analysis: PlateAnalysis;
  /** A screen-sized upright JPEG of the photo, so the app never decodes the original. */
  preview: Blob;
}

export interface PhotoPreview {
  preview: Blob;
  /** Upright size of the original photo. */
  width: number;
  height: number;
}

export const plateApi = {
  /** Starts opencv.js ahead of the first plate. */
  async warmUp(): Promise<void> {
    await loadOpenCv();
  },

  async analyse(
    request: AnalyseRequest,
    onProgress?: (stage: string, fraction: number) => void,
  ): Promise<AnalyseResult> {
    onProgress?.('decode', 0);
    const decoded = await decodePhoto(request.photo, request.name);
    onProgress?.('opencv', 0.1);
    await loadOpenCv();
    const options: AnalyzeOptions = {
      // Every object considered comes back with its features: once the plate is checked they
      // teach the experiment's model without the photo.
      withCandidates: true,
      onProgress: (stage, fraction) => onProgress?.(stage, 0.15 + 0.85 * fraction),
    };
    if (request.palette) options.palette = request.palette;
    if (request.model) options.model = request.model;
    if (request.dish) options.dish = dishToDecoded(request.dish, decoded.k);
    const analysis = await analyzePlate(decoded.image, options);
    return {
      analysis: analysisToOriginal(analysis, decoded.k, decoded.width, decoded.height),
      preview: decoded.preview,
    };
  },

  /**
   * The screen preview and upright size of a photo that was read on another phone, so its
   * analysis can be reviewed here without reading the plate again.
   */
  async preview(photo: Blob, name: string): Promise<PhotoPreview> {
    const { preview, width, height } = await decodePhoto(photo, name);
    return { preview, width, height };
  },

  /**
   * A camera frame as a JPEG photo. The caller transfers the bitmap: from then on it belongs to
   * this worker, which closes it once encoded (the main thread never holds the encode).
   */
  async frameToJpeg(frame: ImageBitmap): Promise<Blob> {
    try {
      const canvas = new OffscreenCanvas(frame.width, frame.height);
      canvas.getContext('2d')!.drawImage(frame, 0, 0);
      return await canvas.convertToBlob({ type: 'image/jpeg', quality: 0.92 });
    } finally {
      frame.close();
    }
  },

  async reclassify(analysis: PlateAnalysis, palette: Palette): Promise<PlateAnalysis> {
    await loadOpenCv();
    return classifyWithPalette(analysis, palette);
  },

  async teachPalette(a: Colony, b: Colony, names: [string, string]): Promise<Palette> {
    await loadOpenCv();
    return paletteFromExamples(a, b, names);
  },

  async learnPalette(analyses: PlateAnalysis[]): Promise<Palette | null> {
    await loadOpenCv();
    return learnPalette(analyses);
  },

  /** The experiment's model refitted from all its checked plates (no opencv needed). */
  async fitModel(
    plates: TeachingPlate[],
    names: [string, string],
    currentReach = 1,
  ): Promise<FitResult> {
    return fitExperimentModel(plates, names, currentReach);
  },
};
