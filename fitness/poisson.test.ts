import { describe, expect, it } from 'vitest';
import { hashSeed, poissonDraw, poissonExactInterval, seededUniform } from './poisson.ts';

describe('poissonExactInterval (Garwood)', () => {
  it('matches the exact (Garwood 1936) 95 % limits', () => {
    // Computed with scipy.stats.chi2.ppf (scipy 1.10.1) as ½χ²(α/2; 2N) and ½χ²(1−α/2; 2N+2);
    // N = 0, 10 and 25 agree with the documentation of epitools' pois.exact and GraphPad's
    // QuickCalcs FAQ on the confidence interval of a count.
    const table: [number, number, number][] = [
      [0, 0, 3.6888794541139354],
      [1, 0.025317807984289876, 5.571643390938898],
      [2, 0.24220927854396496, 7.22468766772396],
      [5, 1.6234863901184207, 11.66833207932267],
      [10, 4.7953886961324335, 18.39035604201778],
      [20, 12.216519585403944, 30.8883779026746],
      [25, 16.178681847829328, 36.904931697530365],
      [50, 37.110963737461866, 65.91876666433681],
      [100, 81.36399125092314, 121.62679379242638],
    ];
    for (const [n, lo, hi] of table) {
      const [l, u] = poissonExactInterval(n);
      expect(l).toBeCloseTo(lo, 8);
      expect(u).toBeCloseTo(hi, 8);
    }
  });

  it('rejects a count that is not a whole number', () => {
    expect(() => poissonExactInterval(-1)).toThrow(RangeError);
    expect(() => poissonExactInterval(1.5)).toThrow(RangeError);
  });
});

describe('seeded Poisson draws', () => {
  it('are reproducible from the seed', () => {
    const a = seededUniform(42);
    const b = seededUniform(42);
    const xs = Array.from({ length: 5 }, () => poissonDraw(150, a));
    const ys = Array.from({ length: 5 }, () => poissonDraw(150, b));
    expect(xs).toEqual(ys);
    expect(hashSeed('A001')).not.toBe(hashSeed('A002'));
  });

  it('have the Poisson mean and variance on both sides of the method switch', () => {
    // For 20,000 draws, the sample mean has SE √(λ/20000) and the variance SE ≈ λ·√(2/20000);
    // the bounds below are about 5 SE.
    for (const lambda of [0.7, 4, 9.5, 10, 37, 250, 5000]) {
      const u = seededUniform(hashSeed(`poisson-${lambda}`));
      const n = 20_000;
      let sum = 0;
      let sumSq = 0;
      let allCounts = true;
      for (let i = 0; i < n; i++) {
        const k = poissonDraw(lambda, u);
        allCounts &&= Number.isInteger(k) && k >= 0;
        sum += k;
        sumSq += k * k;
      }
      expect(allCounts).toBe(true);
      const mean = sum / n;
      const variance = sumSq / n - mean * mean;
      expect(Math.abs(mean - lambda)).toBeLessThan(5 * Math.sqrt(lambda / n));
      expect(Math.abs(variance - lambda)).toBeLessThan(5 * lambda * Math.sqrt(2 / n) + 0.05);
    }
  });

  it('gives P(0) = e^−λ for a small mean', () => {
    const u = seededUniform(7);
    let zeros = 0;
    const n = 20_000;
    for (let i = 0; i < n; i++) if (poissonDraw(1, u) === 0) zeros += 1;
    expect(Math.abs(zeros / n - Math.exp(-1))).toBeLessThan(0.02);
  });
});
