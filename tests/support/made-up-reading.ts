import type { Colony, PlateAnalysis } from '../../cv/index.ts';

/**
 * A made-up reading of a 100 × 100 photo holding `colonies`, with no dish, classes or flags
 * unless `over` gives them: the shell tests of colour sorting and records fill in.
 */
export function madeUpReading(
  colonies: Colony[],
  over: Partial<PlateAnalysis> = {},
): PlateAnalysis {
  return {
    width: 100,
    height: 100,
    scale: 1,
    dish: null,
    colonies,
    neither: [],
    counts: {},
    classes: [],
    agarLab: [60, 15, 5],
    flags: [],
    edgeWidthMm: null,
    timings: {},
    ...over,
  };
}
