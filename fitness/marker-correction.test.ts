import { describe, expect, it } from 'vitest';
import { correctedMean } from './marker-correction.ts';

// Reference values computed once with R 4.2.2 (Debian r-base-core):
//   r: t.test(r, rc) (Welch) estimate difference, statistic, parameter, p.value, conf.int;
//   W: the closed form of marker-correction.ts evaluated in R: R <- mean(w)/mean(wc);
//   u1 <- var(w)/length(w)/mean(w)^2; u2 <- var(wc)/length(wc)/mean(wc)^2; se <- R*sqrt(u1 + u2);
//   df <- (u1 + u2)^2/(u1^2/3 + u2^2/4); t <- (R − 1)/se; 2*pt(−abs(t), df); R ∓ qt(0.975, df)*se.
const w = [1.12, 1.08, 1.15, 1.21];
const wc = [0.97, 0.99, 0.95, 0.98, 1.0];
const r = [0.31, 0.22, 0.4, 0.35];
const rc = [-0.05, 0.02, -0.08, 0.01, -0.02];
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('marker-corrected group means carry the controls’ uncertainty', () => {
  it('r − r̄c: Welch t-test of the group against the controls, as R t.test', () => {
    const c = correctedMean(r, rc, 'difference');
    expect(rel(c.summary.mean, 0.34400000000000003)).toBeLessThan(1e-12);
    expect(rel(c.test!.t, 8.1171818647477512)).toBeLessThan(1e-9);
    expect(rel(c.test!.df, 4.4140425044713574)).toBeLessThan(1e-9);
    expect(rel(c.test!.p, 0.00081585320421527518)).toBeLessThan(1e-6);
    expect(rel(c.summary.ci![0], 0.23056389533394886)).toBeLessThan(1e-6);
    expect(rel(c.summary.ci![1], 0.45743610466605122)).toBeLessThan(1e-6);
  });

  it('W / W̄c: delta-method SE with Welch–Satterthwaite df', () => {
    const c = correctedMean(w, wc, 'ratio');
    expect(rel(c.summary.mean, 1.1656441717791413)).toBeLessThan(1e-12);
    expect(rel(c.summary.se!, 0.029820161029818146)).toBeLessThan(1e-9);
    expect(rel(c.test!.df, 3.8069679206951688)).toBeLessThan(1e-9);
    expect(rel(c.test!.t, 5.5547712037338863)).toBeLessThan(1e-9);
    expect(rel(c.test!.p, 0.0059404418462865516)).toBeLessThan(1e-6);
    expect(rel(c.summary.ci![0], 1.0811679244423991)).toBeLessThan(1e-6);
    expect(rel(c.summary.ci![1], 1.2501204191158835)).toBeLessThan(1e-6);
  });

  it('gives no interval or test with one control', () => {
    const c = correctedMean(w, [0.98], 'ratio');
    expect(c.test).toBeNull();
    expect(c.summary.ci).toBeNull();
    expect(c.summary.sd).not.toBeNull();
  });
});
