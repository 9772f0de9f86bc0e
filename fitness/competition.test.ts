import { describe, expect, it } from 'vitest';
import { type AssayInput, computeAssay } from './competition.ts';
import type { Plate } from './densities.ts';

const plate = (label: string, fold: number, test: number, ref: number): Plate => ({
  label,
  dilutionFold: fold,
  volumeMl: 0.1,
  testColonies: test,
  referenceColonies: ref,
});

function assay(start: Plate[], end: Plate[], D: number, days = 1): AssayInput {
  return {
    assay: 'A1',
    group: 'g',
    line: 'L1',
    generation: 500,
    replicate: '1',
    days,
    foldDilutionSinceStart: D,
    start,
    end,
  };
}

describe('computeAssay', () => {
  it('reproduces a worked example computed by hand', () => {
    // Start 50 test and 50 reference colonies, end 60 and 40, same dilution, D = 100 (values
    // computed by arithmetic from W = m_test / m_ref, not published): W = ln 120 / ln 80 = 1.092529,
    // r = ln 1.5 = 0.405465, s = 0.064136 per generation of the reference.
    const a = computeAssay(
      assay([plate('row 2', 1e4, 50, 50)], [plate('row 3', 1e4, 60, 40)], 100),
    );
    expect(a.mTest).toBeCloseTo(Math.log(120), 12);
    expect(a.mRef).toBeCloseTo(Math.log(80), 12);
    expect(a.W).toBeCloseTo(1.092529, 6);
    expect(a.r).toBeCloseTo(0.405465, 6);
    expect(a.sPerGeneration).toBeCloseTo(0.064136, 6);
    expect(a.sPerGeneration).toBeCloseTo((a.W - 1) * Math.LN2, 12);
    expect(a.generationsRef).toBeCloseTo(Math.log2(80), 12);
    expect(a.flags).toEqual([]);
  });

  it('uses densities, so the dilutions of the start and end plates matter', () => {
    // 1:10⁴ at the start, 1:10⁶ at the end: 100-fold growth of the reference.
    const a = computeAssay(
      assay([plate('row 2', 1e4, 80, 100)], [plate('row 3', 1e6, 120, 100)], 1, 1),
    );
    expect(a.mRef).toBeCloseTo(Math.log(100), 12);
    expect(a.mTest).toBeCloseTo(Math.log(150), 12);
    expect(a.rPerDay).toBe(a.r);
  });

  it('lets D enter W but cancel in r', () => {
    const start = [plate('row 2', 1e4, 80, 100)];
    const end = [plate('row 3', 1e4, 120, 100)];
    const one = computeAssay(assay(start, end, 100, 1));
    const two = computeAssay(assay(start, end, 1e4, 2));
    expect(two.r).toBeCloseTo(one.r, 12);
    expect(two.W).not.toBeCloseTo(one.W, 3);
    expect(two.rPerDay).toBeCloseTo(one.r / 2, 12);
  });

  it('carries counting noise: delta-method SE and a bootstrap interval that agree for large counts', () => {
    const a = computeAssay(
      assay(
        [plate('row 2', 1e3, 2000, 2100), plate('row 3', 1e3, 1900, 2050)],
        [plate('row 4', 1e5, 2600, 1800)],
        1,
      ),
    );
    const varMTest = 1 / 3900 + 1 / 2600;
    const varMRef = 1 / 4150 + 1 / 1800;
    expect(a.countingSe.r).toBeCloseTo(Math.sqrt(varMTest + varMRef), 12);
    expect(a.countingSe.W).toBeCloseTo(Math.sqrt(varMTest + a.W ** 2 * varMRef) / a.mRef, 12);
    expect(a.countingSe.sPerGeneration).toBeCloseTo(Math.LN2 * a.countingSe.W, 12);
    expect(a.countingSe.rPerDay).toBe(a.countingSe.r);
    const [lo, hi] = a.W_ci!;
    expect(lo).toBeLessThan(a.W);
    expect(hi).toBeGreaterThan(a.W);
    // Large counts: the percentile interval is close to W ± 1.96·SE (within 10 % in width).
    expect((hi - lo) / (2 * 1.959964 * a.countingSe.W)).toBeGreaterThan(0.9);
    expect((hi - lo) / (2 * 1.959964 * a.countingSe.W)).toBeLessThan(1.1);
    // Fixed seed: the same interval every time; another seed gives a slightly different one.
    const input = assay(
      [plate('row 2', 1e3, 2000, 2100), plate('row 3', 1e3, 1900, 2050)],
      [plate('row 4', 1e5, 2600, 1800)],
      1,
    );
    const again = computeAssay(input);
    const reseeded = computeAssay(input, { seed: 1 });
    expect(reseeded.W_ci).not.toEqual(a.W_ci);
    expect(Math.abs(reseeded.W_ci![0] - lo)).toBeLessThan(0.1 * (hi - lo));
    expect(again.W_ci).toEqual(a.W_ci);
  });

  it('gives no interval, flagged, when the counts are too small for one', () => {
    const a = computeAssay(assay([plate('row 2', 10, 1, 1)], [plate('row 3', 1000, 1, 1)], 1));
    expect(a.W_ci).toBeNull();
    expect(a.flags.map((f) => f.code)).toContain('ci-undefined');
    expect(Number.isFinite(a.W)).toBe(true);
  });

  it('reports a declining test strain as a flagged result', () => {
    const a = computeAssay(
      assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e4, 40, 200)], 1),
    );
    expect(a.mTest).toBeLessThan(0);
    expect(a.W).toBeLessThan(0);
    expect(a.flags.map((f) => f.code)).toContain('test-declined');
  });

  it('names the assay and the plates when W is undefined or a count is zero', () => {
    expect(() =>
      computeAssay(assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e4, 150, 90)], 1)),
    ).toThrow(/assay A1: the reference did not grow .*row 2, row 3/);
    expect(() =>
      computeAssay(assay([plate('row 2', 1e4, 0, 100)], [plate('row 3', 1e6, 0, 90)], 1)),
    ).toThrow(
      /assay A1: no test colony in the start sample \(row 2\) and no test colony in the end sample \(row 3\); with more than one zero count there is neither a fitness nor a bound/,
    );
    expect(() =>
      computeAssay(assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e6, 10, 90)], 0.5)),
    ).toThrow(/assay A1: fold dilution since start/);
    expect(() =>
      computeAssay(assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e6, 10, 90)], 1, 0)),
    ).toThrow(/assay A1: days/);
  });

  it('flags plates outside the countable range with the range named', () => {
    const a = computeAssay(assay([plate('row 2', 1e4, 10, 9)], [plate('row 3', 1e6, 150, 120)], 1));
    expect(a.flags[0]).toMatchObject({ code: 'out-of-range' });
    expect(a.flags[0]!.message).toMatch(/FDA BAM ch\. 3 \(25–250\).*row 2 \(19, too-few\)/);
    expect(a.flags[0]!.message).not.toMatch(/row 3/);
  });
});

describe('reference generations against days and D', () => {
  // A two-day assay with one 100-fold transfer: each day the reference regrows 100-fold.
  const start = [plate('row 2', 1e4, 50, 50)];
  const end = [plate('row 3', 1e6, 70, 50)];

  it('says nothing when log₂(D) per transfer matches the generations per day', () => {
    const a = computeAssay(assay(start, end, 100, 2));
    expect(a.generationsRef).toBeCloseTo(2 * Math.log2(100), 12);
    expect(a.flags).toEqual([]);
  });

  it('warns when the same assay is entered with D = 1', () => {
    const a = computeAssay(assay(start, end, 1, 2));
    expect(a.flags).toEqual([
      {
        code: 'generations-implausible',
        message:
          'the reference went through 6.64 generations in 2 day(s), but D = 1 over 1 transfer(s) accounts for 0.00 a day: check days and fold_dilution_since_start',
      },
    ]);
  });

  it('warns when the generations per day are outside 1–15', () => {
    const a = computeAssay(assay(start, [plate('row 3', 1e4, 70, 60)], 1, 1));
    const warned = a.flags.filter((f) => f.code === 'generations-implausible');
    expect(warned.map((f) => f.message)).toEqual([
      'the reference went through 0.26 generations in 1 day(s) (0.26 a day, plausible 1–15): check days, fold_dilution_since_start and the plates',
    ]);
  });
});

describe('a strain with no colony: W as a bound', () => {
  // The zero count is taken as its exact one-sided 95 % Poisson limit,
  // R 4.2.2: poisson.test(0, alternative = "less")$conf.int[2] = 2.99573227355399.
  const U = 2.99573227355399;

  it('an extinct test strain gives W at most ln(U·10⁶/(100·10⁴))/ln(90·10⁶/(100·10⁴)), flagged', () => {
    const a = computeAssay(assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e6, 0, 90)], 1));
    const expected = Math.log((U * 1e6) / (100 * 1e4)) / Math.log((90 * 1e6) / (100 * 1e4));
    expect(Math.abs(a.W - expected) / expected).toBeLessThan(1e-9);
    expect(a.bound).toBe('at-most');
    expect(a.W_ci).toBeNull();
    expect(a.flags.find((f) => f.code === 'bounded')!.message).toBe(
      `no test colony in the end sample (row 3): W is at most ${expected.toFixed(4)}, counting the zero as its one-sided 95 % Poisson limit (3.00 colonies); left out of means and tests`,
    );
  });

  it('a reference missing at the end bounds W from below (m_test > 0)', () => {
    const a = computeAssay(
      assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e6, 120, 0)], 1),
    );
    expect(a.bound).toBe('at-least');
    const none = computeAssay(
      assay([plate('row 2', 1e4, 100, 100)], [plate('row 3', 1e6, 120, 90)], 1),
    );
    expect(none.bound).toBeNull();
  });
});
