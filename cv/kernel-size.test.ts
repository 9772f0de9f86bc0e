import { describe, expect, it } from 'vitest';
import { boxPairFor } from './kernel-size.ts';

describe('two boxes for a Gaussian', () => {
  // Reference: the variance of the discrete uniform distribution over w consecutive integers is
  // (w² − 1)/12 (a handbook value), and the variances of successive filters add.
  it('are odd and blur by the asked σ within a quarter of a pixel', () => {
    for (const sigma of [1, 1.7, 2.4, 3.3, 5, 8]) {
      const [a, b] = boxPairFor(sigma);
      expect(a % 2).toBe(1);
      expect(b % 2).toBe(1);
      const blurred = Math.sqrt((a * a - 1 + (b * b - 1)) / 12);
      expect(Math.abs(blurred - sigma)).toBeLessThan(0.25);
    }
  });
});
