/**
 * Poisson counting statistics: exact confidence limits of a count, and a seeded Poisson sampler
 * for the parametric bootstrap.
 */
import gammaln from '@stdlib/math-base-special-gammaln';
import { chiSquareQuantile } from './distributions.ts';

/**
 * Exact (Garwood 1936, Biometrika 28:437) two-sided confidence limits for the mean of a Poisson
 * count N: L = ½·χ²(α/2; 2N) (0 when N = 0), U = ½·χ²(1 − α/2; 2N + 2). The same limits as
 * statsmodels' `confint_poisson(N, 1, method="exact-c")`.
 */
export function poissonExactInterval(count: number, level = 0.95): [number, number] {
  if (!Number.isInteger(count) || count < 0) {
    throw new RangeError(`a count must be a whole number ≥ 0, got ${count}`);
  }
  if (!(level > 0 && level < 1)) throw new RangeError(`level must lie in (0, 1), got ${level}`);
  const alpha = 1 - level;
  const lower = count === 0 ? 0 : chiSquareQuantile(alpha / 2, 2 * count) / 2;
  const upper = chiSquareQuantile(1 - alpha / 2, 2 * count + 2) / 2;
  return [lower, upper];
}

/**
 * Exact one-sided 95 % upper limit of a Poisson mean when the count is 0: P(0 | μ) = e^(−μ) = 0.05,
 * so μ = −ln 0.05 ≈ 2.9957 (= ½·χ²(0.95; 2); R: poisson.test(0, alternative = "less")).
 */
export const ZERO_COUNT_UPPER_95 = -Math.log(0.05);

/** A uniform generator on [0, 1). */
export type Uniform = () => number;

/**
 * mulberry32 (Tommy Ettinger's public-domain 32-bit generator): small, fast and fully determined
 * by its seed, so every bootstrap result can be reproduced exactly.
 */
export function seededUniform(seed: number): Uniform {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** FNV-1a hash of a string: turns an assay name into a seed, so results do not depend on order. */
export function hashSeed(text: string, seed = 0): number {
  let h = (0x811c9dc5 ^ seed) >>> 0;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h;
}

/**
 * One Poisson draw with mean lambda. Below 10: inversion by sequential search (Devroye 1986,
 * Non-Uniform Random Variate Generation, §X.3.3). From 10 on: Hörmann's transformed rejection
 * PTRS (Hörmann 1993, Insurance: Math. & Econ. 12:39), the method NumPy uses for large means.
 */
export function poissonDraw(lambda: number, uniform: Uniform): number {
  if (!(lambda >= 0) || !Number.isFinite(lambda)) {
    throw new RangeError(`Poisson mean must be finite and ≥ 0, got ${lambda}`);
  }
  if (lambda === 0) return 0;
  if (lambda < 10) {
    let k = 0;
    let p = Math.exp(-lambda);
    let cdf = p;
    const u = uniform();
    while (u > cdf && p > 0) {
      k += 1;
      p *= lambda / k;
      cdf += p;
    }
    return k;
  }
  const slam = Math.sqrt(lambda);
  const loglam = Math.log(lambda);
  const b = 0.931 + 2.53 * slam;
  const a = -0.059 + 0.02483 * b;
  const invalpha = 1.1239 + 1.1328 / (b - 3.4);
  const vr = 0.9277 - 3.6224 / (b - 2);
  for (;;) {
    const u = uniform() - 0.5;
    const v = uniform();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + lambda + 0.43);
    if (us >= 0.07 && v <= vr) return k;
    if (k < 0 || (us < 0.013 && v > us)) continue;
    const lhs = Math.log(v) + Math.log(invalpha) - Math.log(a / (us * us) + b);
    if (lhs <= -lambda + k * loglam - gammaln(k + 1)) return k;
  }
}
