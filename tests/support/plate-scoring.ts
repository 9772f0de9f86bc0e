import type { PlateAnalysis } from '../../cv/index.ts';
import type { PlateTruth } from '../../fixtures/plate-types.ts';
import { type Detection, type Score, scoreDetections } from '../../fixtures/score.ts';

/**
 * Scores an analysis against generated truth. An estimated clump of n colonies enters as n
 * detections at its centre; detected class labels are put into the truth's numbering by the
 * pairing that agrees best (a plate clustered alone cannot know which colour is "class 0").
 */
export function scoreAnalysis(truth: PlateTruth, analysis: PlateAnalysis): Score {
  const expand = (swap: boolean): Detection[] =>
    analysis.colonies.flatMap((c) =>
      Array.from({ length: c.count }, () => ({
        x: c.x,
        y: c.y,
        cls: (swap ? 1 - c.cls : c.cls) as 0 | 1,
      })),
    );
  const straight = scoreDetections(truth, expand(false));
  const swapped = scoreDetections(truth, expand(true));
  return swapped.classAccuracy > straight.classAccuracy ? swapped : straight;
}

export function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}
