import { describe, expect, it } from 'vitest';
import { isTwoColours, kmeans2, type Point, robustSpread } from './cluster.ts';

/** Points scattered round a centre by a fixed, seeded pattern (no randomness between runs). */
function cloud(centre: Point, n: number, spread: number, phase = 0): Point[] {
  return Array.from({ length: n }, (_, i) => {
    const t = i * 2.399963 + phase; // golden-angle spiral
    const r = spread * Math.sqrt((i + 0.5) / n);
    return [
      centre[0] + r * Math.cos(t),
      centre[1] + r * Math.sin(t),
      centre[2] + r * Math.cos(2 * t),
    ];
  });
}

describe('kmeans2 and the one-or-two-colours decision', () => {
  it('separates two colours and sizes them right, however lopsided (97:3)', () => {
    const pts = [...cloud([-18, 5, -25], 97, 3), ...cloud([2.5, 0, -2.5], 3, 1.5, 1)];
    const c = kmeans2(pts)!;
    expect(isTwoColours(c)).toBe(true);
    expect([...c.sizes].sort((a, b) => a - b)).toEqual([3, 97]);
  });

  it('a stray object (one blob of ink far from both colours) does not hide a 50:50 split', () => {
    // The farthest-point start seeds a centre on the stray; it must be set aside, not taken as
    // the second colour of a plate whose two real colours are plain.
    const pts: Point[] = [
      ...cloud([-28, 27, -1], 120, 12),
      ...cloud([6, -2, -2], 120, 3, 1),
      [-20, 10, -60],
    ];
    const c = kmeans2(pts)!;
    expect(isTwoColours(c)).toBe(true);
    expect([...c.sizes].sort((a, b) => a - b)).toEqual([120, 121]);
  });

  it('keeps one colour as one, however spread', () => {
    const c = kmeans2(cloud([2.5, 0, -2.5], 150, 4));
    expect(c === null || !isTwoColours(c)).toBe(true);
  });

  it('is deterministic: the same points give the same assignment', () => {
    const pts = [...cloud([-10, 0, -20], 40, 3), ...cloud([3, 1, -3], 60, 2)];
    expect(Array.from(kmeans2(pts)!.assignment)).toEqual(Array.from(kmeans2(pts)!.assignment));
  });

  it('returns null when there is nothing to split', () => {
    expect(kmeans2([])).toBeNull();
    expect(kmeans2([[1, 2, 3]])).toBeNull();
  });
});

describe('a cluster’s spread', () => {
  /** Standard normal draws by the Box–Muller transform of a fixed linear congruential sequence. */
  function normals(n: number): number[] {
    let seed = 12345;
    const uniform = () => {
      seed = (seed * 1103515245 + 12345) % 2 ** 31;
      return (seed + 0.5) / 2 ** 31;
    };
    return Array.from({ length: n }, () => {
      const u = uniform();
      const v = uniform();
      return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    });
  }

  // Reference: the distance of a three-dimensional normal point (σ per axis) from the centre
  // follows the chi distribution with 3 degrees of freedom: RMS √3·σ, median 1.538σ (the χ²₃
  // median 2.366 is a handbook table value, cited from memory).
  it('is the normal cloud’s RMS distance, and a tail of strays does not widen it', () => {
    const sigma = 2;
    const z = normals(3 * 400);
    const cloud: Point[] = Array.from({ length: 400 }, (_, i) => [
      sigma * z[3 * i]!,
      sigma * z[3 * i + 1]!,
      sigma * z[3 * i + 2]!,
    ]);
    const rms = Math.sqrt(3) * sigma;
    expect(robustSpread(cloud, [0, 0, 0])).toBeGreaterThan(0.9 * rms);
    expect(robustSpread(cloud, [0, 0, 0])).toBeLessThan(1.1 * rms);
    // 5 % strays ten σ out would raise the plain RMS to about 1.6 times the cloud's own.
    const strays: Point[] = Array.from({ length: 20 }, (_, i) => {
      const t = (2 * Math.PI * i) / 20;
      return [10 * sigma * Math.cos(t), 10 * sigma * Math.sin(t), 0];
    });
    expect(robustSpread([...cloud, ...strays], [0, 0, 0])).toBeLessThan(1.15 * rms);
  });
});
