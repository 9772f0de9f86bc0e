import { describe, expect, it } from 'vitest';
import { type LineValue, labComparisons } from './lab-comparisons.ts';

// Reference values computed once with R 4.2.2 (Debian r-base-core), on
//   d <- data.frame(line = rep(c("L1","L2","L3"), each = 6),
//                   gen = rep(rep(c(500, 1000), each = 3), 3), W = <the values below>)
// per generation s <- subset(d, gen == g): summary(aov(W ~ line, s)),
// oneway.test(W ~ line, s, var.equal = FALSE), TukeyHSD(aov(W ~ line, s));
// vs the ancestor t.test(W, mu = 1)$p.value per line and generation, and the change
// t.test(W[gen == 1000], W[gen == 500])$p.value per line (Welch), each family through
// p.adjust(p, "holm") and p.adjust(p, "BH").
const W: Record<string, [number[], number[]]> = {
  L1: [
    [1.05, 1.09, 1.02],
    [1.12, 1.18, 1.15],
  ],
  L2: [
    [1.01, 0.98, 1.04],
    [1.21, 1.25, 1.19],
  ],
  L3: [
    [1.1, 1.07, 1.13],
    [1.11, 1.16, 1.09],
  ],
};
const values: LineValue[] = Object.entries(W).flatMap(([line, [g500, g1000]]) => [
  ...g500.map((w) => ({ line, generation: 500, W: w })),
  ...g1000.map((w) => ({ line, generation: 1000, W: w })),
]);
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
const close = (x: number | null | undefined, ref: number, tol = 1e-6) => {
  expect(x).not.toBeNull();
  expect(rel(x!, ref)).toBeLessThan(tol);
};

describe('labComparisons', () => {
  const c = labComparisons(values);

  it('compares lines within each generation: ANOVA with sums of squares, Welch, Tukey', () => {
    expect(c.byGeneration.map((g) => g.generation)).toEqual([500, 1000]);
    const [g500, g1000] = c.byGeneration as [
      (typeof c.byGeneration)[0],
      (typeof c.byGeneration)[0],
    ];
    close(g500.anova!.ssBetween, 0.012155555555555562);
    close(g500.anova!.ssWithin, 0.0060666666666666681);
    close(g500.anova!.f, 6.0109890109890127);
    close(g500.anova!.p, 0.036901700860405388);
    close(g500.welch!.f, 5.7837860531508669);
    close(g500.welch!.dfWithin, 3.9804897083211395);
    close(g500.welch!.p, 0.06641910224548922);
    close(g1000.anova!.f, 7.0319148936170217);
    close(g1000.welch!.p, 0.063150349186770441);
    const R1000: [string, number, number, number, number][] = [
      [
        'L2-L1',
        0.066666666666666874,
        -0.014297200461000331,
        0.14763053379433408,
        0.098696281228128679,
      ],
      [
        'L3-L1',
        -0.029999999999999805,
        -0.11096386712766701,
        0.0509638671276674,
        0.5284967822370179,
      ],
      [
        'L3-L2',
        -0.096666666666666679,
        -0.17763053379433388,
        -0.015702799538999473,
        0.024536074171175093,
      ],
    ];
    g1000.tukey!.forEach((pair, i) => {
      const [name, diff, lwr, upr, p] = R1000[i]!;
      expect(`${pair.first}-${pair.second}`).toBe(name);
      close(pair.diff, diff);
      close(pair.ci[0], lwr);
      close(pair.ci[1], upr);
      expect(Math.abs(pair.pAdjusted - p)).toBeLessThan(1e-5);
    });
  });

  it('tests each line against W = 1 per generation, Holm and BH adjusted as R p.adjust', () => {
    const p = [
      0.11922898789891126, 0.013072457560346461, 0.62203552699077269, 0.0065620582180674469,
      0.028714137642735615, 0.028798969806953258,
    ];
    const holm = [
      0.23845797579782252, 0.065362287801732311, 0.62203552699077269, 0.039372349308404678,
      0.11485655057094246, 0.11485655057094246,
    ];
    const bh = [
      0.14307478547869351, 0.039217372681039385, 0.62203552699077269, 0.039217372681039385,
      0.043198454710429886, 0.043198454710429886,
    ];
    expect(c.vsAncestor.map((x) => `${x.line}@${x.generation}`)).toEqual([
      'L1@500',
      'L1@1000',
      'L2@500',
      'L2@1000',
      'L3@500',
      'L3@1000',
    ]);
    c.vsAncestor.forEach((x, i) => {
      close(x.test!.p, p[i]!);
      close(x.pHolm, holm[i]!);
      close(x.pBH, bh[i]!);
    });
  });

  it("tests each line's change between generations (Welch), Holm and BH adjusted", () => {
    const p = [0.023196289865678583, 0.0011209969350815831, 0.5024390599509525];
    const holm = [0.046392579731357166, 0.0033629908052447491, 0.5024390599509525];
    const bh = [0.034794434798517876, 0.0033629908052447491, 0.5024390599509525];
    c.changes.forEach((x, i) => {
      expect([x.from, x.to]).toEqual([500, 1000]);
      close(x.test!.p, p[i]!);
      close(x.pHolm, holm[i]!);
      close(x.pBH, bh[i]!);
    });
  });

  it('leaves a test that cannot be made out of its family, as null', () => {
    const few = labComparisons([
      ...values,
      { line: 'L4', generation: 500, W: 1.2 },
      { line: 'L4', generation: 1000, W: 1.3 },
    ]);
    const l4 = few.vsAncestor.filter((x) => x.line === 'L4');
    expect(l4.map((x) => [x.test, x.pHolm, x.pBH])).toEqual([
      [null, null, null],
      [null, null, null],
    ]);
    // The other six keep the adjustment over six tests, as before.
    expect(few.vsAncestor[0]!.pHolm).toBe(c.vsAncestor[0]!.pHolm);
    expect(labComparisons([{ line: 'L1', generation: 0, W: 1 }]).byGeneration).toEqual([]);
  });
});

describe('labComparisons with blocks', () => {
  it('adds the blocked analyses (blocks.ts) where every assay of a generation names its block', () => {
    const blocked = values.map((v, i) => ({ ...v, block: `d${i % 3}` }));
    const c = labComparisons(blocked);
    expect(c.byGeneration.map((g) => g.blocked?.blocks)).toEqual([
      ['d0', 'd1', 'd2'],
      ['d0', 'd1', 'd2'],
    ]);
    expect(c.byGeneration[0]!.blocked!.anova).toHaveProperty('line');
    // One assay without a block: no blocked analysis for its generation.
    const partly = blocked.map((v, i) => (i === 0 ? { ...v, block: undefined } : v));
    expect(labComparisons(partly).byGeneration.map((g) => g.blocked === null)).toEqual([
      true,
      false,
    ]);
  });
});
