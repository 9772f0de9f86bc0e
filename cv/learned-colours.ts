import { type Classification, type ColourSample, classifyAside, paletteFrom } from './classify.ts';
import { DISAGREE_MIN, DISAGREE_SHARE } from './learned-select.ts';
import { MIN_TEACHING_SHARE, pairing } from './palette.ts';
import type { Palette, QualityFlag } from './types.ts';

/**
 * Sorting a plate by a learned model's colours, without hiding a mistake. The model's colours are
 * the mean colours of the colonies the lab checked, with their spreads; learned from a few small
 * plates, one colour can come out wide (colonies of every strength) and take in the other's
 * colonies on a plate lit or grown otherwise. So a plate whose colonies show two colours of their
 * own, as a plate must to teach a palette (palette.ts: apart by Ashman's D, each at least
 * MIN_TEACHING_SHARE of the colonies once a few strays such as blobs of ink are set aside), is
 * also sorted by those. Where the two sortings disagree on more than DISAGREE_SHARE of its
 * colonies (and more than DISAGREE_MIN), the plate is sorted by its own two colours, which the
 * model only names (each own colour takes the name of the learned colour it pairs with, by the
 * smaller total colour distance, as palette.ts pairs plates' colours), and carries a
 * 'learned-recolours' flag, so the person checks the colours. A plate of one colour of its own
 * has nothing to compare: its colonies differ only in shade, which any split would cut. The share and the minimum are those learned-select.ts uses
 * for colonies the model adds or drops.
 */
export function sortByLearnedColours(
  samples: readonly ColourSample[],
  aside: readonly boolean[],
  learned: Palette,
): { classes: Classification; flag: QualityFlag | null } {
  const byModel = classifyAside(samples, aside, learned);
  const own = paletteFrom(
    samples.filter((_, i) => !aside[i]),
    MIN_TEACHING_SHARE,
  );
  if (!own) return { classes: byModel, flag: null };
  const named = namedBy(own, learned);
  const byOwn = classifyAside(samples, aside, named);
  const judged = byModel.cls.map((_, i) => i).filter((i) => !byModel.outlier[i]);
  const recoloured = judged.filter((i) => byModel.cls[i] !== byOwn.cls[i]).length;
  if (recoloured <= Math.max(DISAGREE_MIN, DISAGREE_SHARE * judged.length))
    return { classes: byModel, flag: null };
  return {
    classes: byOwn,
    flag: { kind: 'learned-recolours', recoloured, colonies: judged.length },
  };
}

/** The plate's own two colours in the learned palette's order, with its names and looks. */
function namedBy(own: Palette, learned: Palette): Palette {
  const [a, b] = own.colours;
  const [first, second] = pairing(own, learned).swapped ? [b, a] : [a, b];
  const [l0, l1] = learned.colours;
  return {
    version: 1,
    colours: [
      { ...first, name: l0.name, hex: l0.hex },
      { ...second, name: l1.name, hex: l1.hex },
    ],
  };
}
