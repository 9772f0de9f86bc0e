/**
 * The analysis core's result shapes, as the bench app sees them. web/ may not import cv/
 * directly; it takes these types from here, so there is still only one definition of each.
 */
export type {
  CandidateFeatures,
  Colony,
  ColonyClass,
  ColourClass,
  Dish,
  Lab,
  LearnedModel,
  Palette,
  PlateAnalysis,
  QualityFlag,
} from '../cv/types.ts';
