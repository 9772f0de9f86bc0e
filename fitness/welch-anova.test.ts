import { describe, expect, it } from 'vitest';
import { oneWayAnova } from './replicate-stats.ts';
import { welchAnova } from './welch-anova.ts';

// Reference values computed once with R 4.2.2 (Debian r-base-core), on
//   a <- c(1.12, 1.08, 1.15, 1.21, 1.09, 1.17); b <- c(1.02, 0.97, 1.05, 1.01)
//   c <- c(1.3, 1.22, 1.27, 1.35, 1.25); y <- c(a, b, c); g <- factor(rep(c("a","b","c"), c(6,4,5)))
const a = [1.12, 1.08, 1.15, 1.21, 1.09, 1.17];
const b = [1.02, 0.97, 1.05, 1.01];
const c = [1.3, 1.22, 1.27, 1.35, 1.25];
const rel = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe("Welch's one-way ANOVA", () => {
  it('agrees with R oneway.test(y ~ g, var.equal = FALSE)', () => {
    const w = welchAnova([a, b, c])!;
    expect(rel(w.f, 43.054230396254134)).toBeLessThan(1e-9);
    expect(w.dfBetween).toBe(2);
    expect(rel(w.dfWithin, 7.8564404564603434)).toBeLessThan(1e-9);
    expect(rel(w.p, 5.8398348615811626e-5)).toBeLessThan(1e-6);
  });

  it('says null, not NaN, when a group has one value or no spread', () => {
    expect(welchAnova([a, [1.1]])).toBeNull();
    expect(welchAnova([a, [1.1, 1.1, 1.1]])).toBeNull();
    expect(welchAnova([a])).toBeNull();
  });
});

describe('classic one-way ANOVA sums of squares', () => {
  it('agrees with R summary(aov(y ~ g))[[1]]$`Sum Sq`', () => {
    const f = oneWayAnova([a, b, c])!;
    expect(rel(f.ssBetween, 0.158605)).toBeLessThan(1e-9);
    expect(rel(f.ssWithin, 0.025488333333333342)).toBeLessThan(1e-9);
  });
});
