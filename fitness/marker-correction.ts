/**
 * A group's mean after the marker correction, with the uncertainty of the controls' mean carried
 * into its interval and test. The correction divides W by the controls' mean W̄c and subtracts
 * their mean r̄c, so the group's corrected mean is a ratio W̄/W̄c (or a difference r̄ − r̄c) of two
 * independent means, each with its own error:
 * - difference: SE² = s²/n + s_c²/n_c, Welch–Satterthwaite df; the test of r̄ − r̄c = 0 is then
 *   Welch's two-sample t-test of the group against the controls (Welch 1947);
 * - ratio: by the delta method, SE = (W̄/W̄c)·√(s²/(n·W̄²) + s_c²/(n_c·W̄c²)), with the
 *   Welch–Satterthwaite df of those two terms; the test of W̄/W̄c = 1 is t = (W̄/W̄c − 1)/SE.
 * Intervals are mean ± t₀.₉₇₅(df)·SE. Null statistics when either side has fewer than two values
 * or no spread at all.
 */
import { studentTQuantile, studentTTwoSidedP } from './distributions.ts';
import { mean, type Summary, sampleVariance, summarise, type TTest } from './replicate-stats.ts';

export interface CorrectedMean {
  summary: Summary;
  test: TTest | null;
}

export function correctedMean(
  values: readonly number[],
  controls: readonly number[],
  kind: 'ratio' | 'difference',
): CorrectedMean {
  const m = mean(values);
  const mc = mean(controls);
  const estimate = kind === 'ratio' ? m / mc : m - mc;
  const corrected = values.map((v) => (kind === 'ratio' ? v / mc : v - mc));
  const spread = summarise(corrected).sd;
  const v = sampleVariance(values);
  const vc = sampleVariance(controls);
  const none = {
    summary: { n: values.length, mean: estimate, sd: spread, se: null, ci: null },
    test: null,
  };
  if (v === null || vc === null) return none;
  const scale = (x: number) => (kind === 'ratio' ? x * x : 1);
  const u1 = v / values.length / scale(m);
  const u2 = vc / controls.length / scale(mc);
  const relative = Math.sqrt(u1 + u2);
  const se = kind === 'ratio' ? Math.abs(estimate) * relative : relative;
  if (!(se > 1e-12 * Math.max(1, Math.abs(estimate)))) return none;
  const df = (u1 + u2) ** 2 / (u1 ** 2 / (values.length - 1) + u2 ** 2 / (controls.length - 1));
  const half = studentTQuantile(0.975, df) * se;
  const t = (estimate - (kind === 'ratio' ? 1 : 0)) / se;
  return {
    summary: {
      n: values.length,
      mean: estimate,
      sd: spread,
      se,
      ci: [estimate - half, estimate + half],
    },
    test: { t, df, p: studentTTwoSidedP(t, df) },
  };
}
