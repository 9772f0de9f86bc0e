import { describe, expect, it } from 'vitest';
import { type BlockedAnova, type BlockValue, blockedComparison } from './blocks.ts';
import type { MixedModelFit } from './mixed-model.ts';

// Reference values computed once with R 4.2.2 and nlme 3.1-162 (Debian r-base-core, r-cran-nlme):
//   d <- data.frame(block, line, W) as below (unbalanced: block d2 has one L1 assay);
//   summary(aov(W ~ block + line, d)); m <- lme(W ~ line, random = ~ 1 | block, d, method = "REML");
//   summary(m)$tTable; VarCorr(m).
const rows: [string, string, number][] = [
  ['d1', 'L1', 1.12],
  ['d1', 'L1', 1.15],
  ['d1', 'L2', 1.05],
  ['d1', 'L2', 1.02],
  ['d1', 'L3', 1.21],
  ['d1', 'L3', 1.18],
  ['d2', 'L1', 1.19],
  ['d2', 'L2', 1.1],
  ['d2', 'L2', 1.12],
  ['d2', 'L3', 1.27],
  ['d2', 'L3', 1.24],
  ['d3', 'L1', 1.08],
  ['d3', 'L1', 1.11],
  ['d3', 'L2', 1.0],
  ['d3', 'L2', 1.04],
  ['d3', 'L3', 1.16],
  ['d3', 'L3', 1.19],
];
const data: BlockValue[] = rows.map(([block, line, W]) => ({ block, line, W }));
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('blocked comparison of lines', () => {
  const c = blockedComparison(data);

  it('aov(W ~ block + line): sequential sums of squares, F and p as R', () => {
    const a = c.anova as BlockedAnova;
    expect([a.block.df, a.line.df, a.residual.df]).toEqual([2, 2, 12]);
    expect(rel(a.block.ss, 0.021639803921568612)).toBeLessThan(1e-9);
    expect(rel(a.line.ss, 0.070781538461538382)).toBeLessThan(1e-9);
    expect(rel(a.residual.ss, 0.0041551282051281906)).toBeLessThan(1e-9);
    expect(rel(a.block.f, 31.247850155180949)).toBeLessThan(1e-9);
    expect(rel(a.line.f, 102.20845418080863)).toBeLessThan(1e-9);
    expect(rel(a.block.p, 1.7470294790490721e-5)).toBeLessThan(1e-6);
    expect(rel(a.line.p, 2.9062993492979622e-8)).toBeLessThan(1e-6);
  });

  it('lme(W ~ line, random = ~ 1 | block) by REML: fixed effects and variance components', () => {
    const m = c.mixed as MixedModelFit;
    const R: [string, number, number, number, number][] = [
      ['L1', 1.1398033213243575, 0.027220636185296201, 41.872765704867916, 2.2321085996658641e-14],
      [
        'L2 − L1',
        -0.0848033213243575,
        0.011345488016313134,
        -7.4746296679722253,
        7.4837860629400379e-6,
      ],
      [
        'L3 − L1',
        0.068530012008975807,
        0.01134548801631313,
        6.0402877258730348,
        5.8447220571288066e-5,
      ],
    ];
    m.fixed.forEach((f, i) => {
      const [name, estimate, se, t, p] = R[i]!;
      expect(f.name).toBe(name);
      expect(rel(f.estimate, estimate)).toBeLessThan(1e-4);
      expect(rel(f.se, se)).toBeLessThan(1e-4);
      expect(f.df).toBe(12);
      expect(rel(f.t, t)).toBeLessThan(1e-4);
      expect(rel(f.p, p)).toBeLessThan(1e-3);
    });
    expect(rel(m.sdBlock, 0.044832039556265704)).toBeLessThan(1e-4);
    expect(rel(m.sdResidual, 0.018610908777527042)).toBeLessThan(1e-4);
  });

  it('says in words what it cannot fit', () => {
    const one = blockedComparison(data.filter((d) => d.block === 'd1'));
    expect(one.mixed).toEqual({ reason: 'needs assays from two blocks or more' });
    // Each line run in its own block: lines and blocks cannot be told apart.
    const confounded = blockedComparison(data.map((d) => ({ ...d, block: `b-${d.line}` })));
    expect(confounded.anova).toEqual({ reason: 'the lines cannot be told apart from the blocks' });
    expect(confounded.mixed).toEqual({
      reason: 'effects that do not vary within blocks need more blocks than 3 to be tested',
    });
  });
});
