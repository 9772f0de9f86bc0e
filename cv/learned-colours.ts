import { type Classification, type ColourSample, classifyAside, paletteFrom } from './classify.ts';
import { DISAGREE_MIN, DISAGREE_SHARE } from './learned-select.ts';
import { MIN_TEACHING_SHARE } from './palette.ts';
import type { QualityFlag } from './types.ts';

/**
 * Learning never hides a mistake in colour either. A learned model sorts every plate by the two
 * colours of the colonies the lab checked; a plate whose colonies show two colours of their own,
 * as a plate must to teach a palette (palette.ts: apart by Ashman's D, each at least
 * MIN_TEACHING_SHARE of the colonies once a few strays such as blobs of ink are set aside), is also
 * sorted by those, and where the two sortings disagree on more than DISAGREE_SHARE of its colonies
 * (and more than DISAGREE_MIN), the plate carries a 'learned-recolours' flag, so the person checks
 * the colours. The two sortings are paired the way they agree most (the plate's own colours carry
 * no names). A plate of one colour of its own has nothing to compare: its colonies differ only in
 * shade, which any split would cut.
 * The share and the minimum are those learned-select.ts uses for colonies the model adds or drops.
 */

export function learnedColourCheck(
  samples: readonly ColourSample[],
  aside: readonly boolean[],
  learned: Classification,
): QualityFlag | null {
  const ownColours = paletteFrom(
    samples.filter((_, i) => !aside[i]),
    MIN_TEACHING_SHARE,
  );
  if (!ownColours) return null;
  const own = classifyAside(samples, aside, ownColours);
  const judged = learned.cls.map((_, i) => i).filter((i) => !learned.outlier[i]);
  const same = judged.filter((i) => learned.cls[i] === own.cls[i]).length;
  const recoloured = Math.min(same, judged.length - same);
  const limit = Math.max(DISAGREE_MIN, DISAGREE_SHARE * judged.length);
  return recoloured > limit
    ? { kind: 'learned-recolours', recoloured, colonies: judged.length }
    : null;
}
