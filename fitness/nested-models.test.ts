import { describe, expect, it } from 'vitest';
import { extraSumOfSquares, type SharedCurveTest, sharedCurveTest } from './nested-models.ts';
import {
  type CurveFit,
  fitHyperbolic,
  fitNull,
  fitPowerLaw,
  type NullFit,
} from './trajectories.ts';

// Reference values computed once with R 4.2.2 (Debian r-base-core):
//   t <- rep(c(0, 500, 1000, 1500, 2000, 5000, 10000), 2); w, w2 as below;
//   null vs curve: F = ((RSS0 − RSS1)/2)/(RSS1/(n − 2)), pf(F, 2, n − 2, lower.tail = FALSE)
//   (RSS1 = deviance(nls(...)); anova() takes no model without parameters);
//   shared curve: d <- data.frame(t = c(t, t), w = c(w, w2), line = factor(rep(c("A","B"), each = 14)))
//   anova(nls(w ~ 1 + a*t/(t+b), d), nls(w ~ 1 + a[line]*t/(t+b[line]), d)), and the same for
//   (b*t+1)^a; tol 1e-7.
const gens = [0, 500, 1000, 1500, 2000, 5000, 10000];
const w = [1.0, 1.08, 1.15, 1.19, 1.21, 1.3, 1.36, 0.98, 1.1, 1.13, 1.22, 1.19, 1.33, 1.34];
const w2 = [1.02, 1.15, 1.24, 1.3, 1.33, 1.45, 1.5, 1.0, 1.18, 1.22, 1.28, 1.36, 1.44, 1.52];
const A = w.map((v, i) => ({ generation: gens[i % 7]!, w: v }));
const B = w2.map((v, i) => ({ generation: gens[i % 7]!, w: v }));
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('extra-sum-of-squares F test', () => {
  it('null model against each curve', () => {
    const nul = fitNull(A) as NullFit;
    const small = { rss: nul.rss, parameters: 0 };
    const h = fitHyperbolic(A) as CurveFit;
    const th = extraSumOfSquares(small, { rss: h.rss, parameters: 2, n: h.n })!;
    expect(rel(th.f, 1096.0828901201066)).toBeLessThan(1e-6);
    expect([th.df1, th.df2]).toEqual([2, 12]);
    expect(rel(th.p, 2.6038858542474612e-14)).toBeLessThan(1e-5);
    const p = fitPowerLaw(A) as CurveFit;
    const tp = extraSumOfSquares(small, { rss: p.rss, parameters: 2, n: p.n })!;
    expect(rel(tp.f, 775.1115237544916)).toBeLessThan(1e-6);
    expect(rel(tp.p, 2.0541361812425551e-13)).toBeLessThan(1e-5);
    expect(extraSumOfSquares(small, { rss: 0, parameters: 2, n: 14 })).toBeNull();
  });

  it('several lines on one curve, as R anova(shared, separate)', () => {
    const lines = [
      { line: 'A', points: A },
      { line: 'B', points: B },
    ];
    const h = sharedCurveTest('hyperbolic', lines) as SharedCurveTest;
    expect(rel(h.shared.rss, 0.089262262231763506)).toBeLessThan(1e-6);
    expect(rel(h.rssSeparate, 0.0064220298622275603)).toBeLessThan(1e-6);
    expect(rel(h.test!.f, 154.7926138246921)).toBeLessThan(1e-6);
    expect([h.test!.df1, h.test!.df2]).toEqual([2, 24]);
    expect(rel(h.test!.p, 1.9233272165834896e-14)).toBeLessThan(1e-5);
    const p = sharedCurveTest('power-law', lines) as SharedCurveTest;
    expect(rel(p.shared.rss, 0.092635215730556386)).toBeLessThan(1e-6);
    expect(rel(p.rssSeparate, 0.0097611088186096706)).toBeLessThan(1e-6);
    expect(rel(p.test!.f, 101.88281899361216)).toBeLessThan(1e-6);
    expect(rel(p.test!.p, 1.8735981365727226e-12)).toBeLessThan(1e-5);
    expect(sharedCurveTest('hyperbolic', lines.slice(0, 1))).toEqual({
      model: 'hyperbolic',
      reason: 'needs two lines or more',
    });
  });
});
