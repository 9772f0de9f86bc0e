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
 *
 * After the marker correction every W is the raw W divided by the controls' mean W̄c, an estimate
 * with its own error. How that error is carried:
 * - each line against the ancestor: the test of W̄/W̄c = 1 with the delta-method SE and
 *   Welch–Satterthwaite df of marker-correction.ts (the same as for a replicate group);
 * - each line's change D = (W̄₂ − W̄₁)/W̄c: its interval from the delta-method variance
 *   (s₂²/n₂ + s₁²/n₁)/W̄c² + D²·(s_c²/n_c)/W̄c² with Welch–Satterthwaite df over the three terms;
 *   its test of D = 0 is Welch's t, since under D = 0 the controls' term vanishes and the common
 *   divisor cancels from t;
 * - lines against each other (ANOVA, Welch's ANOVA, Tukey p-values): a divisor common to every
 *   value cancels from each F, t and q, so these tests are the same as on the raw W; Tukey's
 *   intervals are on the corrected scale, taking W̄c as known.
 */
import { type BlockedComparison, blockedComparison } from './blocks.ts';
import { studentTQuantile } from './distributions.ts';
import { correctedMean } from './marker-correction.ts';
import { benjaminiHochberg, holm } from './p-adjust.ts';
import {
  type Anova,
  mean,
  oneSampleTTest,
  oneWayAnova,
  sampleVariance,
  summarise,
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
  /** Present when the marker correction was applied: W before it. */
  uncorrected?: { W: number };
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
  /** 95 % interval of the mean W; null with one assay or no spread. */
  ci: [number, number] | null;
}

export interface LineChange extends Adjusted {
  line: string;
  from: number;
  to: number;
  /** Mean W at `to` minus mean W at `from`. */
  diff: number;
  /** 95 % interval of the change; null when either generation has one assay or no spread. */
  ci: [number, number] | null;
}

export interface LabComparisons {
  byGeneration: GenerationComparison[];
  vsAncestor: VersusAncestor[];
  changes: LineChange[];
}

function grouped(
  values: readonly LineValue[],
  field: (v: LineValue) => number,
): Map<string, Map<number, number[]>> {
  const lines = new Map<string, Map<number, number[]>>();
  for (const v of values) {
    const gens = lines.get(v.line) ?? new Map<number, number[]>();
    lines.set(v.line, gens);
    const list = gens.get(v.generation);
    if (list) list.push(field(v));
    else gens.set(v.generation, [field(v)]);
  }
  return lines;
}

/** One line at one generation against W = 1, with the controls' error when corrected. */
function versusAncestor(
  ws: readonly number[],
  raw: readonly number[],
  controls: readonly number[] | undefined,
): { meanW: number; ci: [number, number] | null; test: TTest | null } {
  if (controls) {
    const c = correctedMean(raw, controls, 'ratio');
    return { meanW: c.summary.mean, ci: c.summary.ci, test: c.test };
  }
  const s = summarise(ws);
  return { meanW: s.mean, ci: s.ci, test: oneSampleTTest(ws, 1) };
}

/** The change between two generations, its interval and its test (see the module comment). */
function change(
  before: readonly number[],
  after: readonly number[],
  controls: readonly number[] | undefined,
): { diff: number; ci: [number, number] | null; test: TTest | null } {
  const diff = mean(after) - mean(before);
  const test = welchTTest(after, before);
  const va = sampleVariance(after);
  const vb = sampleVariance(before);
  const vc = controls ? sampleVariance(controls) : 0;
  if (test === null || va === null || vb === null || vc === null) return { diff, ci: null, test };
  // Values here are corrected (raw / W̄c), so s²/n of each generation is already divided by W̄c².
  const terms = [
    { u: va / after.length, df: after.length - 1 },
    { u: vb / before.length, df: before.length - 1 },
    ...(controls
      ? [{ u: (diff ** 2 * vc) / controls.length / mean(controls) ** 2, df: controls.length - 1 }]
      : []),
  ].filter((x) => x.u > 0);
  const u = terms.reduce((s, x) => s + x.u, 0);
  const df = u ** 2 / terms.reduce((s, x) => s + x.u ** 2 / x.df, 0);
  const half = studentTQuantile(0.975, df) * Math.sqrt(u);
  return { diff, ci: [diff - half, diff + half], test };
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

/**
 * `controls`: the marker controls' W when the values were corrected by their mean (their
 * uncertainty is then carried, see above); absent for uncorrected values.
 */
export function labComparisons(
  values: readonly LineValue[],
  controls?: readonly number[],
): LabComparisons {
  const lines = grouped(values, (v) => v.W);
  const raw = grouped(values, (v) => v.uncorrected?.W ?? v.W);
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
        ...versusAncestor(ws, raw.get(line)!.get(generation)!, controls),
        pHolm: null,
        pBH: null,
      });
    }
    for (let i = 1; i < sorted.length; i++) {
      const [from, before] = sorted[i - 1]!;
      const [to, after] = sorted[i]!;
      changes.push({ line, from, to, ...change(before, after, controls), pHolm: null, pBH: null });
    }
  }
  return { byGeneration, vsAncestor: adjust(vsAncestor), changes: adjust(changes) };
}
