/**
 * Statistics over replicate assays: summary with a Student-t interval, one-sample t-test, Welch's
 * two-sample t-test and one-way ANOVA. Textbook formulas (e.g. Zar, Biostatistical Analysis,
 * 5th ed., ch. 7, 8, 10); the t and F distributions come from stdlib (distributions.ts).
 * Nothing here returns NaN or Infinity: a statistic that does not exist (n < 2, no spread) is null.
 * Identical replicates are handled one way throughout: no spread (noSpread below) makes the SD,
 * SE, interval and every test null, as one value does.
 */
import { fUpperP, studentTQuantile, studentTTwoSidedP } from './distributions.ts';

export interface Summary {
  n: number;
  mean: number;
  /** Sample SD (n − 1 in the denominator); null when n < 2 or the values are all equal. */
  sd: number | null;
  se: number | null;
  /** Student-t interval for the mean at `level`; null when n < 2. */
  ci: [number, number] | null;
}

export interface TTest {
  t: number;
  df: number;
  /** Two-sided p-value. */
  p: number;
}

export function mean(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('mean of no values');
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

/** Sample variance with n − 1; null when n < 2. Two-pass for accuracy. */
export function sampleVariance(values: readonly number[]): number | null {
  if (values.length < 2) return null;
  const m = mean(values);
  let ss = 0;
  for (const v of values) ss += (v - m) ** 2;
  return ss / (values.length - 1);
}

export function summarise(values: readonly number[], level = 0.95): Summary {
  for (const v of values) {
    if (!Number.isFinite(v)) throw new RangeError(`cannot summarise a non-finite value (${v})`);
  }
  const n = values.length;
  const m = mean(values);
  const variance = sampleVariance(values);
  const sd = variance === null ? 0 : Math.sqrt(variance);
  const se = sd / Math.sqrt(n);
  if (variance === null || noSpread(se, Math.abs(m))) {
    return { n, mean: m, sd: null, se: null, ci: null };
  }
  const half = studentTQuantile(1 - (1 - level) / 2, n - 1) * se;
  return { n, mean: m, sd, se, ci: [m - half, m + half] };
}

/** A spread smaller than this, relative to the values, counts as none (t would be unbounded). */
function noSpread(se: number, scale: number): boolean {
  return !(se > 1e-12 * Math.max(1, scale));
}

/** Two-sided one-sample t-test of mean = mu0; null when n < 2 or all values are equal. */
export function oneSampleTTest(values: readonly number[], mu0: number): TTest | null {
  const s = summarise(values);
  if (s.se === null) return null;
  const t = (s.mean - mu0) / s.se;
  const df = s.n - 1;
  return { t, df, p: studentTTwoSidedP(t, df) };
}

/**
 * Welch's unequal-variance two-sample t-test (Welch 1947) with Welch–Satterthwaite degrees of
 * freedom; t is mean(a) − mean(b) over its SE. Null when either group has n < 2 or there is no
 * spread at all.
 */
export function welchTTest(a: readonly number[], b: readonly number[]): TTest | null {
  const va = sampleVariance(a);
  const vb = sampleVariance(b);
  if (va === null || vb === null) return null;
  const qa = va / a.length;
  const qb = vb / b.length;
  const se = Math.sqrt(qa + qb);
  const diff = mean(a) - mean(b);
  if (noSpread(se, Math.max(Math.abs(mean(a)), Math.abs(mean(b))))) return null;
  const df = (qa + qb) ** 2 / (qa ** 2 / (a.length - 1) + qb ** 2 / (b.length - 1));
  const t = diff / se;
  return { t, df, p: studentTTwoSidedP(t, df) };
}

export interface Anova {
  f: number;
  dfBetween: number;
  dfWithin: number;
  p: number;
  ssBetween: number;
  ssWithin: number;
}

/**
 * One-way ANOVA (Fisher's F test of equal group means). Needs at least two groups, each with at
 * least one value, and more values than groups; null otherwise or when there is no spread
 * within groups.
 */
export function oneWayAnova(groups: readonly (readonly number[])[]): Anova | null {
  const k = groups.length;
  const all = groups.flat();
  const n = all.length;
  if (k < 2 || n <= k || groups.some((g) => g.length === 0)) return null;
  const grand = mean(all);
  let ssBetween = 0;
  let ssWithin = 0;
  for (const g of groups) {
    const m = mean(g);
    ssBetween += g.length * (m - grand) ** 2;
    for (const v of g) ssWithin += (v - m) ** 2;
  }
  const dfBetween = k - 1;
  const dfWithin = n - k;
  const msWithin = ssWithin / dfWithin;
  if (noSpread(Math.sqrt(msWithin), Math.abs(grand))) return null;
  const f = ssBetween / dfBetween / msWithin;
  return { f, dfBetween, dfWithin, p: fUpperP(f, dfBetween, dfWithin), ssBetween, ssWithin };
}
