/**
 * Comparing least-squares models of one set of values:
 * - the extra-sum-of-squares F test of a model nested in a larger one, as R's anova() gives it
 *   for two nls fits: F = ((RSS₀ − RSS₁)/(p₁ − p₀)) / (RSS₁/(n − p₁)) on (p₁ − p₀, n − p₁) df
 *   (e.g. Bates & Watts 1988, §3.5, from memory);
 * - whether several lines share one curve: one fit of all their values with shared parameters
 *   against a fit per line, by the same F test (the shared fit is the separate fits with their
 *   parameters set equal, so it is nested in them).
 */
import { fUpperP } from './distributions.ts';
import {
  type CurveFit,
  fitHyperbolic,
  fitPowerLaw,
  type ModelFailure,
  type TrajectoryPoint,
} from './trajectories.ts';

export interface FTest {
  f: number;
  df1: number;
  df2: number;
  p: number;
}

/** Null when the larger model leaves no residual df or fits exactly. */
export function extraSumOfSquares(
  small: { rss: number; parameters: number },
  big: { rss: number; parameters: number; n: number },
): FTest | null {
  const df1 = big.parameters - small.parameters;
  const df2 = big.n - big.parameters;
  if (df1 <= 0 || df2 <= 0 || !(big.rss > 0)) return null;
  const f = Math.max(0, (small.rss - big.rss) / df1 / (big.rss / df2));
  return { f, df1, df2, p: fUpperP(f, df1, df2) };
}

export interface SharedCurveTest {
  model: CurveFit['model'];
  lines: string[];
  /** One curve through every line's values. */
  shared: CurveFit;
  /** Σ RSS of the fits line by line. */
  rssSeparate: number;
  test: FTest | null;
}

const FIT = { hyperbolic: fitHyperbolic, 'power-law': fitPowerLaw };

/**
 * Tests whether the lines follow one curve of the model. A failure, in words, when fewer than two
 * lines are given or a fit (shared or per line) cannot be made.
 */
export function sharedCurveTest(
  model: CurveFit['model'],
  lines: readonly { line: string; points: readonly TrajectoryPoint[] }[],
): SharedCurveTest | ModelFailure {
  if (lines.length < 2) return { model, reason: 'needs two lines or more' };
  const separate = lines.map((l) => ({ line: l.line, fit: FIT[model](l.points) }));
  const failed = separate.find((s) => 'reason' in s.fit);
  if (failed) {
    return {
      model,
      reason: `line ${failed.line} has no ${model} fit of its own (${(failed.fit as ModelFailure).reason})`,
    };
  }
  const shared = FIT[model](lines.flatMap((l) => l.points));
  if ('reason' in shared) return { model, reason: `no shared fit: ${shared.reason}` };
  const rssSeparate = separate.reduce((s, x) => s + (x.fit as CurveFit).rss, 0);
  const n = lines.reduce((s, l) => s + l.points.length, 0);
  return {
    model,
    lines: lines.map((l) => l.line),
    shared,
    rssSeparate,
    test: extraSumOfSquares(
      { rss: shared.rss, parameters: 2 },
      { rss: rssSeparate, parameters: 2 * lines.length, n },
    ),
  };
}
