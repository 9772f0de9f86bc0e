import { classify, paletteFrom, paletteFromSamples } from './classify.ts';
import { colonyFlags, countsByClass, imageFlags } from './summary.ts';
import type { Colony, Palette, PlateAnalysis } from './types.ts';

/**
 * Palettes: the two marker colours of an experiment, so every plate is judged against the same
 * pair. Learned from the colonies of several plates pooled (a batch, or an experiment's first
 * plates), or taught by pointing at one colony of each colour.
 */
export function learnPalette(analyses: readonly PlateAnalysis[]): Palette | null {
  return paletteFrom(analyses.flatMap((a) => a.colonies));
}

export function paletteFromExamples(a: Colony, b: Colony, names?: [string, string]): Palette {
  return paletteFromSamples(a, b, names);
}

/**
 * Re-sorts an analysis's colonies against a palette without segmenting the photo again; blobs of
 * neither palette colour are left out and counted in a 'colour-outliers' flag.
 */
export function classifyWithPalette(analysis: PlateAnalysis, palette: Palette): PlateAnalysis {
  const result = classify(analysis.colonies, palette);
  const colonies = analysis.colonies
    .map((c, i) => ({
      ...c,
      cls: result.cls[i]!,
      confidence: Math.round(result.confidence[i]! * 1000) / 1000,
    }))
    .filter((_, i) => !result.outlier[i]);
  const outliers = analysis.colonies.length - colonies.length;
  return {
    ...analysis,
    colonies,
    classes: result.classes,
    counts: countsByClass(colonies, result.classes),
    flags: [...imageFlags(analysis.flags), ...colonyFlags(colonies, result.oneColour, outliers)],
  };
}
