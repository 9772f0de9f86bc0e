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

// After the marker correction: an invented set of raw W, corrected by the controls' mean. Reference
// values computed once with R 4.2.2 (Debian r-base-core), options(digits = 17), by this script:
//   wc <- c(0.97, 1.01, 0.95, 0.99); mc <- mean(wc)
//   ratio <- function(w) { R <- mean(w)/mc; u1 <- var(w)/length(w)/mean(w)^2
//     u2 <- var(wc)/length(wc)/mc^2; se <- R*sqrt(u1 + u2)
//     df <- (u1 + u2)^2/(u1^2/(length(w) - 1) + u2^2/(length(wc) - 1)); t <- (R - 1)/se
//     c(R, R - qt(0.975, df)*se, R + qt(0.975, df)*se, t, df, 2*pt(-abs(t), df)) }
//   chg <- function(b, a) { A <- a/mc; B <- b/mc; D <- mean(A) - mean(B)
//     u <- c(var(A)/length(A), var(B)/length(B), D^2*var(wc)/length(wc)/mc^2)
//     df <- sum(u)^2/sum(u^2/c(length(A) - 1, length(B) - 1, length(wc) - 1)); se <- sqrt(sum(u))
//     c(D, D - qt(0.975, df)*se, D + qt(0.975, df)*se, t.test(a, b)$p.value) }
// with p.adjust(p, "holm") and p.adjust(p, "BH") over each family.
describe('labComparisons after the marker correction carry the controls’ uncertainty', () => {
  const wc = [0.97, 1.01, 0.95, 0.99];
  const mc = wc.reduce((s, w) => s + w, 0) / wc.length;
  const raw: Record<string, [number[], number[]]> = {
    L1: [
      [1.08, 1.12, 1.05],
      [1.19, 1.24, 1.15],
    ],
    L2: [
      [1.02, 0.99, 1.06],
      [1.1, 1.16, 1.13, 1.08],
    ],
  };
  const corrected: LineValue[] = Object.entries(raw).flatMap(([line, gens]) =>
    gens.flatMap((ws, i) =>
      ws.map((w) => ({ line, generation: i === 0 ? 500 : 1000, W: w / mc, uncorrected: { W: w } })),
    ),
  );
  const c = labComparisons(corrected, wc);

  it('each line against the ancestor: delta-method SE with Welch–Satterthwaite df, as in R', () => {
    const R: [string, number, number[], number, number, number, number][] = [
      [
        'L1',
        500,
        [1.1054421768707485, 1.0340542760833484, 1.1768300776581486],
        3.8435975145183994,
        0.015271683472413221,
        0.030543366944826442,
        0.020362244629884292,
      ],
      [
        'L1',
        1000,
        [1.217687074829932, 1.1254602115432437, 1.3099139381166203],
        3.4211300344752189,
        0.0038208757097422654,
        0.011462627129226795,
        0.0076417514194845309,
      ],
      [
        'L2',
        500,
        [1.0442176870748301, 0.97280199036184245, 1.1156333837878178],
        3.6796600744552284,
        0.1559424343371264,
        0.1559424343371264,
        0.1559424343371264,
      ],
      [
        'L2',
        1000,
        [1.1403061224489794, 1.0827988897137815, 1.1978133551841774],
        5.8291441042458558,
        0.0010601021882411061,
        0.0042404087529644245,
        0.0042404087529644245,
      ],
    ];
    for (const [line, generation, [m, lo, hi], df, p, holm, bh] of R) {
      const x = c.vsAncestor.find((v) => v.line === line && v.generation === generation)!;
      close(x.meanW, m!, 1e-12);
      close(x.ci![0], lo!);
      close(x.ci![1], hi!);
      close(x.test!.df, df, 1e-9);
      close(x.test!.p, p);
      close(x.pHolm, holm);
      close(x.pBH, bh);
    }
  });

  it('each line’s change: interval with the controls’ term, Welch’s test, as in R', () => {
    const R: [string, number, number, number, number, number, number][] = [
      [
        'L1',
        0.11224489795918369,
        0.016567343160049722,
        0.20792245275831767,
        0.031674850744978146,
        0.041271550655087495,
        0.031674850744978146,
      ],
      [
        'L2',
        0.096088435374149794,
        0.023142101866310841,
        0.16903476888198876,
        0.020635775327543748,
        0.041271550655087495,
        0.031674850744978146,
      ],
    ];
    for (const [line, diff, lo, hi, p, holm, bh] of R) {
      const x = c.changes.find((v) => v.line === line)!;
      close(x.diff, diff, 1e-12);
      close(x.ci![0], lo);
      close(x.ci![1], hi);
      close(x.test!.p, p);
      close(x.pHolm, holm);
      close(x.pBH, bh);
    }
  });

  it('the test of no change is the same as with the controls’ mean taken as known', () => {
    // Under D = 0 the controls' term vanishes and the common divisor cancels from Welch's t.
    const known = labComparisons(corrected.map(({ uncorrected: _, ...v }) => v));
    for (const [i, x] of c.changes.entries()) close(x.test!.t, known.changes[i]!.test!.t, 1e-12);
  });
});
