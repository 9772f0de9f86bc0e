/**
 * Lines compared at one generation when assays were run in blocks (days or batches):
 * - the fixed-effects analysis R gives as aov(W ~ block + line): sequential sums of squares, block
 *   first, so the test of lines is adjusted for the blocks (least-squares.ts);
 * - the mixed model R gives as nlme::lme(W ~ line, random = ~ 1 | block) (mixed-model.ts): the
 *   line effects with their SEs, df and p, and the two variance components.
 * Which to read: the aov when the blocks are the few days this experiment happened to use and
 * every line was run in every block (the line test is then exact); the mixed model when the blocks
 * stand for days in general, when lines are missing from some blocks, or to see how large the
 * day-to-day spread is beside the spread within a day (Pinheiro & Bates 2000, ch. 1, from memory).
 * Factors use R's treatment coding: levels in sorted order, each line compared with the first.
 */
import { fUpperP } from './distributions.ts';
import { sequentialFit, type Term } from './least-squares.ts';
import { type MixedModelFailure, type MixedModelFit, randomInterceptReml } from './mixed-model.ts';

export interface BlockValue {
  line: string;
  block: string;
  W: number;
}

export interface AnovaRow {
  df: number;
  ss: number;
  ms: number;
  f: number;
  p: number;
}

export interface BlockedAnova {
  block: AnovaRow;
  line: AnovaRow;
  residual: { df: number; ss: number; ms: number };
}

export interface BlockedComparison {
  blocks: string[];
  anova: BlockedAnova | { reason: string };
  mixed: MixedModelFit | MixedModelFailure;
}

const levels = (values: readonly string[]) => [...new Set(values)].sort();

/** Treatment-coded dummy columns of a factor: one per level after the first. */
function dummies(values: readonly string[]): { level: string; column: number[] }[] {
  return levels(values)
    .slice(1)
    .map((level) => ({ level, column: values.map((v) => (v === level ? 1 : 0)) }));
}

function blockedAnova(data: readonly BlockValue[]): BlockedAnova | { reason: string } {
  const y = data.map((d) => d.W);
  const terms: Term[] = [
    { name: 'intercept', columns: [y.map(() => 1)] },
    { name: 'block', columns: dummies(data.map((d) => d.block)).map((d) => d.column) },
    { name: 'line', columns: dummies(data.map((d) => d.line)).map((d) => d.column) },
  ];
  const fit = sequentialFit(y, terms);
  const [, block, line] = fit.terms as [
    unknown,
    { df: number; ss: number },
    { df: number; ss: number },
  ];
  if (fit.residualDf < 1 || !(fit.rss > 1e-24)) {
    return { reason: 'no residual variation left after blocks and lines' };
  }
  if (line.df === 0) return { reason: 'the lines cannot be told apart from the blocks' };
  const ms = fit.rss / fit.residualDf;
  const row = (t: { df: number; ss: number }): AnovaRow => {
    const f = t.ss / t.df / ms;
    return { df: t.df, ss: t.ss, ms: t.ss / t.df, f, p: fUpperP(f, t.df, fit.residualDf) };
  };
  return {
    block: block.df > 0 ? row(block) : { df: 0, ss: 0, ms: 0, f: 0, p: 1 },
    line: row(line),
    residual: { df: fit.residualDf, ss: fit.rss, ms },
  };
}

export function blockedComparison(data: readonly BlockValue[]): BlockedComparison {
  const y = data.map((d) => d.W);
  const lineValues = data.map((d) => d.line);
  const first = levels(lineValues)[0]!;
  const columns = [
    { name: first, values: y.map(() => 1) },
    ...dummies(lineValues).map((d) => ({ name: `${d.level} − ${first}`, values: d.column })),
  ];
  return {
    blocks: levels(data.map((d) => d.block)),
    anova: blockedAnova(data),
    mixed: randomInterceptReml(
      y,
      columns,
      data.map((d) => d.block),
    ),
  };
}
