import { describe, expect, it } from 'vitest';
import { tukeyHsd } from './tukey-hsd.ts';

// Reference values computed once with R 4.2.2 (Debian r-base-core), on
//   a <- c(1.12, 1.08, 1.15, 1.21, 1.09, 1.17); b <- c(1.02, 0.97, 1.05, 1.01)
//   c <- c(1.3, 1.22, 1.27, 1.35, 1.25); y <- c(a, b, c); g <- factor(rep(c("a","b","c"), c(6,4,5)))
const a = [1.12, 1.08, 1.15, 1.21, 1.09, 1.17];
const b = [1.02, 0.97, 1.05, 1.01];
const c = [1.3, 1.22, 1.27, 1.35, 1.25];
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe("Tukey's HSD", () => {
  it('agrees with R TukeyHSD(aov(y ~ g))', () => {
    const pairs = tukeyHsd([
      { name: 'a', values: a },
      { name: 'b', values: b },
      { name: 'c', values: c },
    ])!;
    // R: rows b-a, c-a, c-b with diff, lwr, upr, p adj.
    const R: [string, string, number, number, number, number][] = [
      [
        'b',
        'a',
        -0.12416666666666654,
        -0.20353332686583153,
        -0.044800006467501527,
        3.4139782865628687e-3,
      ],
      [
        'c',
        'a',
        0.14133333333333331,
        0.066880806572790399,
        0.21578586009387624,
        7.5000616811549126e-4,
      ],
      [
        'c',
        'b',
        0.26549999999999985,
        0.18301974726479478,
        0.34798025273520494,
        5.025109610201639e-6,
      ],
    ];
    expect(pairs).toHaveLength(3);
    pairs.forEach((p, i) => {
      const [first, second, diff, lwr, upr, padj] = R[i]!;
      expect([p.first, p.second]).toEqual([first, second]);
      expect(rel(p.diff, diff)).toBeLessThan(1e-9);
      expect(rel(p.ci[0], lwr)).toBeLessThan(1e-6);
      expect(rel(p.ci[1], upr)).toBeLessThan(1e-6);
      expect(Math.abs(p.pAdjusted - padj)).toBeLessThan(1e-5);
    });
  });

  it('says null with too few residual degrees of freedom or no spread', () => {
    expect(
      tukeyHsd([
        { name: 'a', values: [1, 2] },
        { name: 'b', values: [3] },
      ]),
    ).toBeNull();
    expect(
      tukeyHsd([
        { name: 'a', values: [1, 1] },
        { name: 'b', values: [2, 2] },
      ]),
    ).toBeNull();
  });
});
