import { describe, expect, it } from 'vitest';
import { benjaminiHochberg, holm } from './p-adjust.ts';

describe('p-value adjustment', () => {
  // R: p <- c(0.01, 0.04, 0.03, 0.005, 0.2, 0.04); p.adjust(p, "holm"); p.adjust(p, "BH")
  const p = [0.01, 0.04, 0.03, 0.005, 0.2, 0.04];
  it('Holm as R p.adjust(p, "holm")', () => {
    holm(p).forEach((x, i) => {
      expect(x).toBeCloseTo([0.05, 0.12, 0.12, 0.03, 0.2, 0.12][i]!, 12);
    });
  });
  it('Benjamini–Hochberg as R p.adjust(p, "BH")', () => {
    benjaminiHochberg(p).forEach((x, i) => {
      expect(x).toBeCloseTo([0.03, 0.048, 0.048, 0.03, 0.2, 0.048][i]!, 12);
    });
    expect(holm([])).toEqual([]);
  });
});
