import { describe, expect, it } from 'vitest';
import {
  chiSquareQuantile,
  fUpperP,
  studentTQuantile,
  studentTTwoSidedP,
} from './distributions.ts';

describe('Student t from stdlib', () => {
  it('matches the handbook t table, t(0.975, df)', () => {
    // NIST/SEMATECH e-Handbook of Statistical Methods, table of critical values of Student's t,
    // 3 decimals.
    const table: [number, number][] = [
      [1, 12.706],
      [2, 4.303],
      [3, 3.182],
      [4, 2.776],
      [5, 2.571],
      [6, 2.447],
      [7, 2.365],
      [8, 2.306],
      [9, 2.262],
      [10, 2.228],
      [20, 2.086],
      [30, 2.042],
    ];
    for (const [df, t] of table) expect(studentTQuantile(0.975, df)).toBeCloseTo(t, 3);
    // df → ∞: the normal quantile 1.959964 (computed with scipy.stats.norm.ppf(0.975)).
    expect(studentTQuantile(0.975, 1e7)).toBeCloseTo(1.959964, 5);
  });

  it('gives two-sided p-values that invert the quantiles', () => {
    expect(studentTTwoSidedP(12.706204736, 1)).toBeCloseTo(0.05, 8);
    expect(studentTTwoSidedP(-2.228138852, 10)).toBeCloseTo(0.05, 8);
    expect(studentTTwoSidedP(0, 5)).toBe(1);
  });

  it('refuses arguments that would give NaN', () => {
    expect(() => studentTQuantile(1, 5)).toThrow(RangeError);
    expect(() => studentTQuantile(0.5, 0)).toThrow(RangeError);
    expect(() => studentTTwoSidedP(Number.NaN, 5)).toThrow(RangeError);
    expect(() => fUpperP(1, 0, 3)).toThrow(RangeError);
  });
});

describe('F and chi-square from stdlib', () => {
  it('F upper tail at known critical values', () => {
    // F(0.95; 2, 12) = 3.885294 and F(0.99; 3, 20) = 4.938193: scipy 1.10.1,
    // scipy.stats.f.ppf(0.95, 2, 12) and f.ppf(0.99, 3, 20).
    expect(fUpperP(3.885293835, 2, 12)).toBeCloseTo(0.05, 7);
    expect(fUpperP(4.938193382, 3, 20)).toBeCloseTo(0.01, 7);
    expect(fUpperP(0, 3, 20)).toBe(1);
    // A far tail keeps its digits: scipy.stats.f.sf(40, 5, 60) = 7.06828554947683e-18
    // (scipy 1.10.1), where 1 − cdf would give 0.
    expect(fUpperP(40, 5, 60) / 7.06828554947683e-18).toBeCloseTo(1, 8);
  });

  it('chi-square quantiles', () => {
    // χ²(0.975; 2) = −2 ln 0.025 = 7.377759 (closed form for 2 df).
    expect(chiSquareQuantile(0.975, 2)).toBeCloseTo(-2 * Math.log(0.025), 10);
  });
});
