import {
  classifyAside,
  colourFeature,
  OUTLIER_SPREADS,
  paletteFrom,
  paletteFromSamples,
  spreadsFromShade,
} from './classify.ts';
import { deltaE76 } from './colour.ts';
import { colonyFlags, countsByClass, imageFlags } from './summary.ts';
import type { Colony, Palette, PaletteColour, PlateAnalysis } from './types.ts';

/**
 * Palettes: the two marker colours of an experiment, so every plate is judged against the same
 * pair. Learned from the colonies of several plates pooled (a batch, or an experiment's first
 * plates), or taught by pointing at one colony of each colour.
 */
export function learnPalette(analyses: readonly PlateAnalysis[]): Palette | null {
  let { trusted, twoColour } = teachers(analyses, DOUBTFUL);
  if (twoColour.length < MIN_TEACHERS) {
    const more = teachers(analyses, DOUBTFUL_BUT_FOCUS);
    if (more.twoColour.length > twoColour.length) ({ trusted, twoColour } = more);
  }
  if (twoColour.length === 0) return paletteFrom(trusted.flatMap((a) => clearOf(a)));
  return mergePalettes(twoColour);
}

/** The plates that may teach, and the two colours of each that shows two. */
function teachers(analyses: readonly PlateAnalysis[], doubtful: ReadonlySet<string>) {
  const trusted = analyses.filter((a) => isTrustworthy(a, doubtful));
  const twoColour = trusted.flatMap((a) => {
    const p = paletteFrom(clearOf(a), MIN_TEACHING_SHARE);
    return p ? [{ palette: p, weight: a.colonies.length }] : [];
  });
  return { trusted, twoColour };
}

/** The colonies whose colour may teach: not those seen through lid glare (classify.ts). */
function clearOf(a: PlateAnalysis): Colony[] {
  return a.colonies.filter((c) => !c.glareLit);
}

/** Plates that may teach colours: the dish was found and nothing whole-plate is in doubt. */
const DOUBTFUL = new Set<string>([
  'dish-not-found',
  'coarse-photo',
  'out-of-focus',
  'nothing-found',
  'many-rejected',
  'unstable-count',
]);
function isTrustworthy(a: PlateAnalysis, doubtful: ReadonlySet<string>): boolean {
  return a.colonies.length >= MIN_TEACHING_COLONIES && !a.flags.some((f) => doubtful.has(f.kind));
}
/**
 * One plate is not a batch: its colours leave out how colonies vary from plate to plate, and a
 * palette that narrow sets aside the real colonies of the other plates as of neither colour.
 * With fewer than MIN_TEACHERS plates able to teach, plates doubted only for their focus teach
 * too: blur softens a colony's edge, not the colour of its middle.
 */
const MIN_TEACHERS = 2;
const DOUBTFUL_BUT_FOCUS = new Set([...DOUBTFUL].filter((kind) => kind !== 'out-of-focus'));
const MIN_TEACHING_COLONIES = 10;
/**
 * A plate teaches colours only when each holds at least this share of its colonies: a lopsided
 * split is as likely a few stray objects as a rare strain, and is sorted, not learned from.
 */
export const MIN_TEACHING_SHARE = 0.1;

/**
 * One palette from the palettes of several plates, each learned on its own plate (so a lighting
 * change between plates cannot blur the two colours into one): colours are paired with those of
 * the medoid plate (the one closest to all others, so one odd plate cannot lead) by the smaller
 * total distance, then averaged, weighted by colony numbers; spreads are pooled as root mean
 * squares. A plate whose pair does not match the medoid's (either colour further than
 * OUTLIER_SPREADS of the medoid colour's spreads from any shade of it, classify.ts: it split glare
 * from colonies, or one colour by shade) is left out rather than averaged in.
 */
function mergePalettes(parts: readonly { palette: Palette; weight: number }[]): Palette {
  const ref = medoid(parts.map((p) => p.palette));
  const sums = [0, 1].map(() => ({ w: 0, delta: [0, 0, 0], spread2: 0 }));
  for (const { palette, weight } of parts) {
    const [a, b] = palette.colours;
    const ordered = pairing(palette, ref).swapped ? [b, a] : [a, b];
    if (ordered.some((c, k) => !isNearColour(c, ref.colours[k as 0 | 1]))) continue;
    ordered.forEach((c, k) => {
      const s = sums[k]!;
      s.w += weight;
      for (let j = 0; j < 3; j++) s.delta[j]! += weight * c.deltaLab[j]!;
      s.spread2 += weight * c.spread ** 2;
    });
  }
  const colours = ref.colours.map((c, k) => {
    const s = sums[k]!;
    return {
      ...c,
      deltaLab: [s.delta[0]! / s.w, s.delta[1]! / s.w, s.delta[2]! / s.w] as const,
      spread: Math.sqrt(s.spread2 / s.w),
    };
  });
  return { version: 1, colours: [colours[0]!, colours[1]!] };
}

function isNearColour(c: PaletteColour, ref: PaletteColour): boolean {
  return spreadsFromShade(colourFeature(c.deltaLab), ref) <= OUTLIER_SPREADS;
}

export function paletteFromExamples(a: Colony, b: Colony, names?: [string, string]): Palette {
  return paletteFromSamples(a, b, names);
}

/**
 * Re-sorts an analysis's colonies against a palette without segmenting the photo again. Objects
 * of neither palette colour are moved to `neither` (not counted, for the person to decide, and
 * counted in a 'colour-outliers' flag); those an earlier palette set aside are considered again.
 */
export function classifyWithPalette(analysis: PlateAnalysis, palette: Palette): PlateAnalysis {
  const all = [...analysis.colonies, ...(analysis.neither ?? [])];
  const result = classifyAside(
    all,
    all.map((c) => c.glareLit === true),
    palette,
  );
  const sorted = all.map((c, i) => ({
    ...c,
    cls: result.cls[i]!,
    confidence: Math.round(result.confidence[i]! * 1000) / 1000,
  }));
  const colonies = sorted.filter((_, i) => !result.outlier[i]);
  const neither = sorted.filter((_, i) => result.outlier[i]);
  return {
    ...analysis,
    colonies,
    neither,
    classes: result.classes,
    counts: countsByClass(colonies, result.classes),
    flags: [
      ...imageFlags(analysis.flags),
      ...colonyFlags(colonies, result.oneColour, neither.length),
    ],
  };
}
/** How palette `p` pairs with `q`: swapped or not, and the total colour distance of the pairing. */
export function pairing(p: Palette, q: Palette): { swapped: boolean; distance: number } {
  const [a, b] = p.colours;
  const [c, d] = q.colours;
  const straight = deltaE76(a.deltaLab, c.deltaLab) + deltaE76(b.deltaLab, d.deltaLab);
  const swapped = deltaE76(a.deltaLab, d.deltaLab) + deltaE76(b.deltaLab, c.deltaLab);
  return swapped < straight
    ? { swapped: true, distance: swapped }
    : { swapped: false, distance: straight };
}

function medoid(palettes: readonly Palette[]): Palette {
  let best = palettes[0]!;
  let bestSum = Number.POSITIVE_INFINITY;
  for (const p of palettes) {
    const sum = palettes.reduce((s, q) => s + pairing(p, q).distance, 0);
    if (sum < bestSum) {
      bestSum = sum;
      best = p;
    }
  }
  return best;
}
