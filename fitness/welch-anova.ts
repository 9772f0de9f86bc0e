/**
 * Welch's one-way ANOVA for means with unequal variances (Welch 1951, Biometrika 38:330), the test
 * R gives as oneway.test(y ~ g, var.equal = FALSE): with wᵢ = nᵢ/sᵢ², W = Σwᵢ, m̄ = Σwᵢmᵢ/W,
 *   A = Σwᵢ(mᵢ − m̄)²/(k − 1),  λ = Σ(1 − wᵢ/W)²/(nᵢ − 1) / (k² − 1),
 *   F = A / (1 + 2(k − 2)λ),  df = (k − 1, 1/(3λ)).
 * Needs two groups or more, each with two values or more and some spread; null otherwise.
 */
import { fUpperP } from './distributions.ts';
import { mean, sampleVariance } from './replicate-stats.ts';

export interface WelchAnova {
  f: number;
  dfBetween: number;
  dfWithin: number;
  p: number;
}

export function welchAnova(groups: readonly (readonly number[])[]): WelchAnova | null {
  const k = groups.length;
  if (k < 2) return null;
  const parts: { n: number; m: number; w: number }[] = [];
  for (const g of groups) {
    const v = sampleVariance(g);
    const m = g.length > 0 ? mean(g) : 0;
    if (v === null || !(v > 1e-24 * Math.max(1, m * m))) return null;
    parts.push({ n: g.length, m, w: g.length / v });
  }
  const W = parts.reduce((s, x) => s + x.w, 0);
  const grand = parts.reduce((s, x) => s + x.w * x.m, 0) / W;
  const a = parts.reduce((s, x) => s + x.w * (x.m - grand) ** 2, 0) / (k - 1);
  const lambda = parts.reduce((s, x) => s + (1 - x.w / W) ** 2 / (x.n - 1), 0) / (k * k - 1);
  const f = a / (1 + 2 * (k - 2) * lambda);
  const dfWithin = 1 / (3 * lambda);
  return { f, dfBetween: k - 1, dfWithin, p: fUpperP(f, k - 1, dfWithin) };
}
