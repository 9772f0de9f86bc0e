/**
 * Tukey's honestly significant difference for all pairs of groups after a one-way ANOVA, with the
 * Tukey–Kramer form for unequal group sizes (Tukey 1953; Kramer 1956, Biometrics 12:307), as R's
 * TukeyHSD(aov(y ~ g)) gives it: for groups i < j, diff = mⱼ − mᵢ, SE = √(MSE/2·(1/nᵢ + 1/nⱼ)),
 * interval diff ∓ q₀.₉₅(k, df)·SE and adjusted p = P(Q ≥ |diff|/SE), Q the studentized range of
 * k means with the ANOVA's residual df.
 */
import { mean } from './replicate-stats.ts';
import { studentizedRangeQuantile, studentizedRangeUpperP } from './studentized-range.ts';

export interface TukeyPair {
  /** The later group minus the earlier one, in the order given (R's "j-i"). */
  first: string;
  second: string;
  diff: number;
  ci: [number, number];
  pAdjusted: number;
}

/** Null when there are fewer than two groups, an empty one, < 2 residual df or no spread. */
export function tukeyHsd(
  groups: readonly { name: string; values: readonly number[] }[],
  level = 0.95,
): TukeyPair[] | null {
  const k = groups.length;
  const n = groups.reduce((s, g) => s + g.values.length, 0);
  if (k < 2 || n - k < 2 || groups.some((g) => g.values.length === 0)) return null;
  const means = groups.map((g) => mean(g.values));
  let ssWithin = 0;
  groups.forEach((g, i) => {
    for (const v of g.values) ssWithin += (v - means[i]!) ** 2;
  });
  const df = n - k;
  const mse = ssWithin / df;
  const scale = Math.max(1, ...means.map(Math.abs));
  if (!(Math.sqrt(mse) > 1e-12 * scale)) return null;
  const q = studentizedRangeQuantile(level, k, df);
  const pairs: TukeyPair[] = [];
  for (let i = 0; i < k; i++) {
    for (let j = i + 1; j < k; j++) {
      const a = groups[i]!;
      const b = groups[j]!;
      const diff = means[j]! - means[i]!;
      const se = Math.sqrt((mse / 2) * (1 / a.values.length + 1 / b.values.length));
      pairs.push({
        first: b.name,
        second: a.name,
        diff,
        ci: [diff - q * se, diff + q * se],
        pAdjusted: studentizedRangeUpperP(Math.abs(diff) / se, k, df),
      });
    }
  }
  return pairs;
}
