/**
 * The comparisons a lab makes of its evolved lines, several in one run, on assay-level W:
 * - within each generation, the lines against each other: the classic one-way ANOVA (with its
 *   sums of squares), Welch's one-way ANOVA, and Tukey's HSD for every pair of lines;
 * - each line against the ancestor (W = 1) at each generation: two-sided one-sample t-tests;
 * - each line's change between consecutive measured generations: Welch's two-sample t-tests.
 * The last two are families of many tests, so each carries Holm and Benjamini–Hochberg adjusted
 * p-values (p-adjust.ts) over the tests of its family that exist (a test that cannot be made, for
 * one assay or no spread, is null and not counted).
 * When the assays of a generation were run in two blocks or more (every one naming its block), the
 * lines are also compared with the blocks taken into account (blocks.ts).
 */
import { type BlockedComparison, blockedComparison } from './blocks.ts';
import { benjaminiHochberg, holm } from './p-adjust.ts';
import {
  type Anova,
  mean,
  oneSampleTTest,
  oneWayAnova,
  type TTest,
  welchTTest,
} from './replicate-stats.ts';
import { type TukeyPair, tukeyHsd } from './tukey-hsd.ts';
import { type WelchAnova, welchAnova } from './welch-anova.ts';

export interface LineValue {
  line: string;
  generation: number;
  W: number;
  block?: string;
}

export interface GenerationComparison {
  generation: number;
  lines: { line: string; n: number; meanW: number }[];
  anova: Anova | null;
  welch: WelchAnova | null;
  tukey: TukeyPair[] | null;
  /** With blocks: aov(W ~ block + line) and the REML random-intercept model; else null. */
  blocked: BlockedComparison | null;
}

export interface Adjusted {
  test: TTest | null;
  /** Holm-adjusted p over the family; null when the test could not be made. */
  pHolm: number | null;
  /** Benjamini–Hochberg-adjusted p over the family; null when the test could not be made. */
  pBH: number | null;
}

export interface VersusAncestor extends Adjusted {
  line: string;
  generation: number;
  n: number;
  meanW: number;
}

export interface LineChange extends Adjusted {
  line: string;
  from: number;
  to: number;
  /** Mean W at `to` minus mean W at `from`. */
  diff: number;
}

export interface LabComparisons {
  byGeneration: GenerationComparison[];
  vsAncestor: VersusAncestor[];
  changes: LineChange[];
}

function grouped(values: readonly LineValue[]): Map<string, Map<number, number[]>> {
  const lines = new Map<string, Map<number, number[]>>();
  for (const v of values) {
    const gens = lines.get(v.line) ?? new Map<number, number[]>();
    lines.set(v.line, gens);
    const list = gens.get(v.generation);
    if (list) list.push(v.W);
    else gens.set(v.generation, [v.W]);
  }
  return lines;
}

/** Adds the adjusted p-values of one family to its tests, in place. */
function adjust<T extends Adjusted>(family: T[]): T[] {
  const made = family.filter((x) => x.test !== null);
  const p = made.map((x) => x.test!.p);
  const h = holm(p);
  const bh = benjaminiHochberg(p);
  made.forEach((x, i) => {
    x.pHolm = h[i]!;
    x.pBH = bh[i]!;
  });
  return family;
}

export function labComparisons(values: readonly LineValue[]): LabComparisons {
  const lines = grouped(values);
  const generations = [...new Set(values.map((v) => v.generation))].sort((a, b) => a - b);
  const byGeneration: GenerationComparison[] = [];
  for (const generation of generations) {
    const present = [...lines]
      .filter(([, gens]) => gens.has(generation))
      .map(([line, gens]) => ({ line, values: gens.get(generation)! }));
    if (present.length < 2) continue;
    const groups = present.map((p) => p.values);
    const here = values.filter((v) => v.generation === generation);
    const blocks = new Set(here.map((v) => v.block));
    byGeneration.push({
      generation,
      lines: present.map((p) => ({ line: p.line, n: p.values.length, meanW: mean(p.values) })),
      anova: oneWayAnova(groups),
      welch: welchAnova(groups),
      tukey: tukeyHsd(present.map((p) => ({ name: p.line, values: p.values }))),
      blocked:
        blocks.size >= 2 && !blocks.has(undefined)
          ? blockedComparison(here.map((v) => ({ line: v.line, block: v.block!, W: v.W })))
          : null,
    });
  }
  const vsAncestor: VersusAncestor[] = [];
  const changes: LineChange[] = [];
  for (const [line, gens] of lines) {
    const sorted = [...gens].sort((a, b) => a[0] - b[0]);
    for (const [generation, ws] of sorted) {
      vsAncestor.push({
        line,
        generation,
        n: ws.length,
        meanW: mean(ws),
        test: oneSampleTTest(ws, 1),
        pHolm: null,
        pBH: null,
      });
    }
    for (let i = 1; i < sorted.length; i++) {
      const [from, before] = sorted[i - 1]!;
      const [to, after] = sorted[i]!;
      changes.push({
        line,
        from,
        to,
        diff: mean(after) - mean(before),
        test: welchTTest(after, before),
        pHolm: null,
        pBH: null,
      });
    }
  }
  return { byGeneration, vsAncestor: adjust(vsAncestor), changes: adjust(changes) };
}
