/**
 * The probability distributions the engine needs, taken from stdlib (stdlib-js, a general-purpose
 * numerical library) rather than hand-written series. Each wrapper checks its arguments so a bad
 * call fails loudly instead of handing back NaN.
 */
import chisquareQuantile from '@stdlib/stats-base-dists-chisquare-quantile';
import fCdf from '@stdlib/stats-base-dists-f-cdf';
import tCdf from '@stdlib/stats-base-dists-t-cdf';
import tQuantile from '@stdlib/stats-base-dists-t-quantile';

function finite(value: number, what: string): number {
  if (!Number.isFinite(value)) throw new RangeError(`${what} is not a finite number (${value})`);
  return value;
}

function checkProbability(p: number): void {
  if (!(p > 0 && p < 1)) throw new RangeError(`probability must lie in (0, 1), got ${p}`);
}

function checkDf(df: number, what = 'degrees of freedom'): void {
  if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`${what} must be > 0, got ${df}`);
}

/** Student's t quantile: the t with P(T ≤ t) = p for df degrees of freedom. */
export function studentTQuantile(p: number, df: number): number {
  checkProbability(p);
  checkDf(df);
  return finite(tQuantile(p, df), `t quantile(${p}, ${df})`);
}

/** Two-sided p-value of a t statistic: P(|T| ≥ |t|). */
export function studentTTwoSidedP(t: number, df: number): number {
  finite(t, 't statistic');
  checkDf(df);
  const p = 2 * tCdf(-Math.abs(t), df);
  return Math.min(1, finite(p, `t cdf(${t}, ${df})`));
}

/** Upper-tail p-value of an F statistic: P(F ≥ f) with (df1, df2) degrees of freedom. */
export function fUpperP(f: number, df1: number, df2: number): number {
  finite(f, 'F statistic');
  checkDf(df1, 'numerator degrees of freedom');
  checkDf(df2, 'denominator degrees of freedom');
  if (f <= 0) return 1;
  // P(F(df1, df2) ≥ f) = P(F(df2, df1) ≤ 1/f): the lower tail keeps its precision where
  // 1 − cdf would round a tiny p to 0.
  return finite(fCdf(1 / f, df2, df1), `F cdf(${1 / f}, ${df2}, ${df1})`);
}

/** Chi-square quantile: the x with P(X ≤ x) = p for df degrees of freedom. */
export function chiSquareQuantile(p: number, df: number): number {
  checkProbability(p);
  checkDf(df);
  return finite(chisquareQuantile(p, df), `chi-square quantile(${p}, ${df})`);
}
