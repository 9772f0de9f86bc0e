/**
 * The plate-analysis core: pure TypeScript over RGBA pixels and opencv.js, the same in Node and in
 * a browser worker.
 */
export { analyzePlate } from './analyze.ts';
export { MAX_PIXELS, PlateImageError } from './image-input.ts';
export { type CandidateLabel, labelsFromCorrections } from './labels.ts';
export {
  coloniesNeeded,
  decidesColonies,
  learnModel,
  ModelError,
  searchReach,
} from './learned-model.ts';
export { modelToJson, parseModel } from './model-file.ts';
export { loadOpenCv, provideOpenCvModule } from './opencv.ts';
export { classifyWithPalette, learnPalette, paletteFromExamples } from './palette.ts';
export { analysisToOriginal, dishToDecoded, pointToDecoded } from './photo-pixels.ts';
export type * from './types.ts';
