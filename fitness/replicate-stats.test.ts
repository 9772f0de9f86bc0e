import { describe, expect, it } from 'vitest';
import { oneSampleTTest, oneWayAnova, summarise, welchTTest } from './replicate-stats.ts';

// Reference values computed once with SciPy 1.10.1 (Debian bookworm python3-scipy), by
//   scipy.stats.ttest_1samp(a, 1.0); numpy.std(a, ddof=1);
//   scipy.stats.t.interval(0.95, len(a) - 1, loc=mean(a), scale=scipy.stats.sem(a));
//   scipy.stats.ttest_ind(a, b, equal_var=False) (Welch df by its formula);
//   scipy.stats.f_oneway(a, b, c).
const a = [1.12, 1.08, 1.15, 1.21, 1.09, 1.17];
const b = [1.02, 0.97, 1.05, 1.01];
const c = [1.3, 1.22, 1.27, 1.35, 1.25];

describe('summarise', () => {
  it('mean, SD, SE and the Student-t 95 % interval agree with SciPy', () => {
    const s = summarise(a);
    expect(s.n).toBe(6);
    expect(s.mean).toBeCloseTo(1.1366666666666667, 12);
    expect(s.sd).toBeCloseTo(0.04966554808583774, 12);
    expect(s.se).toBeCloseTo(0.04966554808583774 / Math.sqrt(6), 12);
    expect(s.ci![0]).toBeCloseTo(1.0845458704105824, 10);
    expect(s.ci![1]).toBeCloseTo(1.188787462922751, 10);
  });

  it('says null, not NaN, for what one value cannot give', () => {
    expect(summarise([1.2])).toEqual({ n: 1, mean: 1.2, sd: null, se: null, ci: null });
    expect(oneSampleTTest([1.2], 1)).toBeNull();
    expect(oneSampleTTest([1.1, 1.1, 1.1], 1)).toBeNull();
    expect(() => summarise([1, Number.NaN])).toThrow(RangeError);
  });
});

describe('t-tests and ANOVA', () => {
  it('one-sample t-test of W = 1', () => {
    const t = oneSampleTTest(a, 1)!;
    expect(t.t).toBeCloseTo(6.740358479519659, 10);
    expect(t.df).toBe(5);
    expect(t.p).toBeCloseTo(0.0010903382164808636, 10);
  });

  it("Welch's two-sample t-test", () => {
    const t = welchTTest(a, b)!;
    expect(t.t).toBeCloseTo(4.747534759684894, 10);
    expect(t.df).toBeCloseTo(7.980412220195136, 10);
    expect(t.p).toBeCloseTo(0.0014596431246483093, 10);
    const back = welchTTest(b, a)!;
    expect(back.t).toBeCloseTo(-t.t, 12);
    expect(back.p).toBeCloseTo(t.p, 12);
    expect(welchTTest([1], b)).toBeNull();
  });

  it('one-way ANOVA', () => {
    const f = oneWayAnova([a, b, c])!;
    expect(f.f).toBeCloseTo(37.33590531615772, 9);
    expect(f.dfBetween).toBe(2);
    expect(f.dfWithin).toBe(12);
    expect(f.p).toBeCloseTo(7.044014805398526e-6, 11);
    expect(oneWayAnova([a])).toBeNull();
    expect(oneWayAnova([[1], [2]])).toBeNull();
  });
});

describe('identical replicates', () => {
  it('are handled one way: no SD, SE, interval or test, as for one value', () => {
    expect(summarise([1.1, 1.1, 1.1])).toEqual({ n: 3, mean: 1.1, sd: null, se: null, ci: null });
    expect(oneSampleTTest([1.1, 1.1, 1.1], 1)).toBeNull();
    expect(welchTTest([1.1, 1.1], [1.1, 1.1])).toBeNull();
  });
});
