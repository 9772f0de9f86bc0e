import { describe, expect, it } from 'vitest';
import {
  type CurveFit,
  curveAt,
  curveBand,
  fitHyperbolic,
  fitNull,
  fitPowerLaw,
  fitStep,
  leastSquaresLogLik,
  type NullFit,
  type StepFit,
  type TrajectoryPoint,
} from './trajectories.ts';

const gens = [0, 500, 1000, 1500, 2000, 5000, 10000];
const ws = [1.0, 1.08, 1.15, 1.19, 1.21, 1.3, 1.36, 0.98, 1.1, 1.13, 1.22, 1.19, 1.33, 1.34];
const points: TrajectoryPoint[] = ws.map((w, i) => ({ generation: gens[i % 7]!, w }));

const fitted = (m: unknown): CurveFit => {
  if (!m || typeof m !== 'object' || !('parameters' in m))
    throw new Error(`not fitted: ${JSON.stringify(m)}`);
  return m as CurveFit;
};

// Reference fits computed once with SciPy 1.10.1 (Debian bookworm python3-scipy):
//   scipy.optimize.curve_fit(f, t, w, p0=..., xtol=ftol=gtol=1e-15) for
//   f = 1 + a·t/(t + b) (p0 = [0.4, 2000]) and f = (b·t + 1)**a (p0 = [0.08, 0.005]);
//   SE = sqrt(diag(pcov)); AIC and BIC from logLik = −n/2·(ln 2π + 1 + ln(RSS/n)) with k = 3.
describe('curve fits against SciPy curve_fit', () => {
  it('hyperbolic model', () => {
    const m = fitted(fitHyperbolic(points));
    expect(m.parameters[0]!.estimate).toBeCloseTo(0.42019696162871045, 6);
    expect(m.parameters[1]!.estimate / 1866.3851675853907).toBeCloseTo(1, 6);
    expect(m.parameters[0]!.se).toBeCloseTo(0.018491274638281163, 6);
    expect(m.parameters[1]!.se / 220.65115395696162).toBeCloseTo(1, 5);
    expect(m.rss).toBeCloseTo(0.003620417335002043, 12);
    expect(m.aic).toBeCloseTo(-69.9128473191636, 6);
    expect(m.bic).toBeCloseTo(-67.99567533031782, 6);
    expect(m.k).toBe(3);
    expect(m.converged).toBe(true);
    expect(m.parameters.some((p) => p.poorlyDetermined)).toBe(false);
  });

  it('power-law model', () => {
    const m = fitted(fitPowerLaw(points));
    expect(m.parameters[0]!.estimate).toBeCloseTo(0.08025038602164089, 7);
    expect(m.parameters[1]!.estimate / 0.004751680725065566).toBeCloseTo(1, 5);
    expect(m.parameters[0]!.se).toBeCloseTo(0.0072176653465711085, 7);
    expect(m.parameters[1]!.se / 0.0012964784243318255).toBeCloseTo(1, 5);
    expect(m.aic).toBeCloseTo(-65.09349755269926, 6);
    expect(m.bic).toBeCloseTo(-63.17632556385349, 6);
  });

  it('draws each curve from its published formula with the SciPy parameters', () => {
    // w = 1 + a·t/(t + b) and w = (b·t + 1)^a at the SciPy estimates above, at generations
    // between the measured ones; the curves agree with the fit to the precision of the estimates.
    const hyper = curveAt(fitted(fitHyperbolic(points)));
    const power = curveAt(fitted(fitPowerLaw(points)));
    for (const t of [0, 250, 3000, 7500]) {
      expect(hyper(t)).toBeCloseTo(1 + (0.42019696162871045 * t) / (t + 1866.3851675853907), 5);
      expect(power(t)).toBeCloseTo((0.004751680725065566 * t + 1) ** 0.08025038602164089, 5);
    }
    // At the measured generations the curve is the observed value minus its residual.
    const m = fitted(fitHyperbolic(points));
    points.forEach((p, i) => {
      expect(hyper(p.generation)).toBeCloseTo(p.w - m.residuals[i]!, 12);
    });
  });

  it('the log-likelihood is the one statsmodels reports for least squares', () => {
    // statsmodels 0.13.5 (Debian python3-statsmodels): sm.OLS(y, ones).fit().llf for
    // y = [1.0, 1.08, 1.15, 1.19, 1.21, 1.30, 1.36] is 5.268350066536355.
    const y = [1.0, 1.08, 1.15, 1.19, 1.21, 1.3, 1.36];
    const mean = y.reduce((s, v) => s + v, 0) / y.length;
    const rss = y.reduce((s, v) => s + (v - mean) ** 2, 0);
    expect(leastSquaresLogLik(rss, y.length)).toBeCloseTo(5.268350066536355, 10);
  });

  it('recovers known parameters from exact-model data with small noise', () => {
    // Point checks, by arithmetic from the two formulas: hyp(1000; a = 0.5, b = 1000) = 1.25,
    // pow(1000; a = 0.1, b = 0.01) = 11^0.1 = 1.270982.
    const noise = [0.002, -0.001, 0.0015, -0.002, 0.001, -0.0005, 0.0008, -0.0012];
    const ts = [0, 250, 500, 1000, 2000, 3000, 5000, 8000];
    const hyp = fitted(
      fitHyperbolic(
        ts.map((t, i) => ({ generation: t, w: 1 + (0.5 * t) / (t + 1000) + noise[i]! })),
      ),
    );
    expect(hyp.parameters[0]!.estimate).toBeCloseTo(0.5, 1);
    expect(hyp.parameters[1]!.estimate / 1000).toBeCloseTo(1, 1);
    const pow = fitted(
      fitPowerLaw(ts.map((t, i) => ({ generation: t, w: (0.01 * t + 1) ** 0.1 + noise[i]! }))),
    );
    expect(pow.parameters[0]!.estimate).toBeCloseTo(0.1, 1);
    expect((0.01 * 1000 + 1) ** 0.1).toBeCloseTo(1.270982, 6);
  });

  it('says when a parameter is poorly determined, and when a model cannot be fitted', () => {
    // Flat, noisy data: the curvature b is not identified.
    const flat = [0, 500, 1000, 1500, 2000].flatMap((t, i) => [
      { generation: t, w: 1.1 + (i % 2 ? 0.03 : -0.03) },
      { generation: t, w: 1.1 + (i % 2 ? -0.02 : 0.02) },
    ]);
    const m = fitted(fitHyperbolic(flat));
    expect(m.parameters.some((p) => p.poorlyDetermined)).toBe(true);
    expect(fitHyperbolic(points.slice(0, 2))).toMatchObject({
      model: 'hyperbolic',
      reason: expect.any(String),
    });
    expect(
      fitPowerLaw([
        { generation: 500, w: 1.1 },
        { generation: 500, w: 1.2 },
        { generation: 500, w: 1.15 },
      ]),
    ).toMatchObject({
      reason: expect.stringContaining('2 generations'),
    });
  });
});

/** All segmentations with k change points between distinct generations, by brute force. */
function bruteForceRss(data: TrajectoryPoint[], k: number): number {
  const distinct = [...new Set(data.map((p) => p.generation))].sort((x, y) => x - y);
  let best = Number.POSITIVE_INFINITY;
  const choose = (from: number, left: number, cuts: number[]) => {
    if (left === 0) {
      const bounds = [
        Number.NEGATIVE_INFINITY,
        ...cuts.map((c) => distinct[c]!),
        Number.POSITIVE_INFINITY,
      ];
      let rss = 0;
      for (let s = 0; s + 1 < bounds.length; s++) {
        const seg = data.filter((p) => p.generation >= bounds[s]! && p.generation < bounds[s + 1]!);
        const m = seg.reduce((acc, p) => acc + p.w, 0) / seg.length;
        rss += seg.reduce((acc, p) => acc + (p.w - m) ** 2, 0);
      }
      best = Math.min(best, rss);
      return;
    }
    for (let c = from; c < distinct.length; c++) choose(c + 1, left - 1, [...cuts, c]);
  };
  choose(1, k, []);
  return best;
}

describe('step model', () => {
  it('finds the optimal segmentation (checked by brute force) and picks k by BIC', () => {
    const data: TrajectoryPoint[] = [
      0, 0, 250, 250, 500, 500, 750, 750, 1000, 1000, 1500, 1500, 2000, 2000,
    ].map((t, i) => ({
      generation: t,
      w:
        (t < 600 ? 1.05 : t < 1200 ? 1.2 : 1.32) +
        (i % 3 === 0 ? 0.01 : i % 3 === 1 ? -0.008 : 0.003),
    }));
    const fit = fitStep(data, 3) as StepFit;
    expect(fit.model).toBe('step');
    expect(fit.changePoints).toBe(2);
    expect(fit.steps).toEqual([
      { after: 500, before: 750 },
      { after: 1000, before: 1500 },
    ]);
    expect(fit.rss).toBeCloseTo(bruteForceRss(data, 2), 12);
    for (const b of fit.bicByChangePoints) {
      const rss = bruteForceRss(data, b.changePoints);
      const p = 2 * b.changePoints + 2;
      expect(b.bic).toBeCloseTo(
        -2 * leastSquaresLogLik(rss, data.length) + p * Math.log(data.length),
        8,
      );
    }
    expect(fit.segments.map((s) => s.w.toFixed(2))).toEqual(['1.05', '1.20', '1.32']);
    expect(fit.residuals).toHaveLength(data.length);
  });

  it('keeps replicates of one generation together and copes with unordered input', () => {
    const data = points.slice().reverse();
    const fit = fitStep(data) as StepFit;
    expect(fit.rss).toBeCloseTo(bruteForceRss(data, fit.changePoints), 12);
    for (const s of fit.steps) expect(s.after).toBeLessThan(s.before);
  });
});

// Reference values computed once with R 4.2.2 (Debian r-base-core) on the 14 points above:
//   h <- nls(w ~ 1 + a*t/(t+b)); p <- nls(w ~ (b*t+1)^a) (tol 1e-7, started at the estimates);
//   Wald: coef ± qt(0.975, df.residual) · SE from summary(); AICc = AIC(fit) + 2k(k+1)/(n−k−1),
//   k = 3; null model w = 1: RSS = sum((w − 1)^2), logLik = −n/2·(log(2π) + 1 + log(RSS/n)), k = 1;
//   band: g = c(t/(t+b), −a·t/(t+b)^2), fit ± qt(0.975, n − 2)·sqrt(t(g) %*% vcov(h) %*% g).
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('intervals, AICc, the null model and the band, against R', () => {
  it('Wald 95 % intervals and AICc of both curves', () => {
    const h = fitted(fitHyperbolic(points));
    expect(rel(h.parameters[0]!.ci[0], 0.37990793611480511)).toBeLessThan(1e-6);
    expect(rel(h.parameters[0]!.ci[1], 0.46048599115547706)).toBeLessThan(1e-6);
    expect(rel(h.parameters[1]!.ci[0], 1385.627630400995)).toBeLessThan(1e-6);
    expect(rel(h.parameters[1]!.ci[1], 2347.1427523885377)).toBeLessThan(1e-6);
    expect(rel(h.aicc!, -67.512847319163527)).toBeLessThan(1e-6);
    const p = fitted(fitPowerLaw(points));
    expect(rel(p.parameters[0]!.ci[0], 0.064524439249026427)).toBeLessThan(1e-6);
    expect(rel(p.parameters[1]!.ci[1], 0.0075764660443948945)).toBeLessThan(1e-6);
    expect(rel(p.aicc!, -62.693497552699093)).toBeLessThan(1e-6);
  });

  it('the null model w = 1', () => {
    const n = fitNull(points) as NullFit;
    expect(rel(n.rss, 0.66500000000000015)).toBeLessThan(1e-12);
    expect(n.k).toBe(1);
    expect(rel(n.aic, -0.9280790214507455)).toBeLessThan(1e-9);
    expect(rel(n.aicc!, -0.59474568811741224)).toBeLessThan(1e-9);
    expect(rel(n.bic, -0.28902169183548709)).toBeLessThan(1e-9);
    expect(
      fitNull([
        { generation: 0, w: 1 },
        { generation: 5, w: 1 },
      ]),
    ).toMatchObject({
      reason: 'every value is exactly 1',
    });
  });

  it('the 95 % confidence band of the hyperbolic curve (delta method)', () => {
    const band = curveBand(fitted(fitHyperbolic(points)), [0, 250, 3000, 7500]);
    const R = [
      [1, 1, 1],
      [1.0496361632730733, 1.0421563046772926, 1.057116021868854],
      [1.2590405077539952, 1.246378353469707, 1.2717026620382834],
      [1.3364667545553148, 1.3173679898463877, 1.355565519264242],
    ];
    band.forEach((b, i) => {
      const [w, low, high] = R[i]!;
      expect(rel(b.w, w!)).toBeLessThan(1e-6);
      expect(rel(b.low, low!)).toBeLessThan(1e-6);
      expect(rel(b.high, high!)).toBeLessThan(1e-6);
    });
  });

  it('marks a parameter poorly determined when its 95 % interval contains 0', () => {
    for (const q of fitted(fitHyperbolic(points)).parameters) {
      expect(q.poorlyDetermined).toBe(q.ci[0] <= 0 && q.ci[1] >= 0);
    }
  });

  it('fits nothing that would leave fewer than two residual degrees of freedom', () => {
    const three = points.slice(0, 3);
    expect(fitHyperbolic(three)).toMatchObject({
      reason: 'needs ≥ 4 values at ≥ 2 generations (two residual degrees of freedom), has 3 at 3',
    });
    // Step: with 4 values, k = 1 would leave 4 − 3 = 1 residual df, so only k = 0 is tried.
    const step = fitStep(points.slice(0, 4), 3) as StepFit;
    expect(step.bicByChangePoints.map((b) => b.changePoints)).toEqual([0]);
  });
});

describe('step model cost', () => {
  it('chooses the segmentation on the RSS it reports, even far from zero', () => {
    // Values near 1000 with steps of 1e-5: Σw² − (Σw)²/m would lose these digits.
    const data: TrajectoryPoint[] = [0, 0, 0, 500, 500, 500, 1000, 1000, 1000].map((t, i) => ({
      generation: t,
      w: 1000 + (t >= 500 ? 1e-5 : 0) + [1, -2, 1.5][i % 3]! * 1e-7,
    }));
    const fit = fitStep(data, 2) as StepFit;
    expect(fit.changePoints).toBe(1);
    expect(fit.steps).toEqual([{ after: 0, before: 500 }]);
    expect(fit.rss / bruteForceRss(data, 1)).toBeCloseTo(1, 9);
  });
});
