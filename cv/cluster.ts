/**
 * Two-cluster k-means (Lloyd's algorithm) with a deterministic start, and the test that decides
 * whether a set of colony colours holds one colour or two.
 *
 * Points are colour features (see colour-features.ts). Start: the point farthest from the mean
 * and the point farthest from that one, so the result never depends on a random seed and a 97:3
 * plate still seeds one centre in the small class. The pair is accepted as two colours only when
 * the centres lie further apart than SEPARATION_SD pooled within-cluster standard deviations and
 * at least MIN_SEPARATION feature units: a single-colour plate's natural spread does not pass.
 */
export type Point = readonly [number, number, number];

export interface TwoClusters {
  centres: [Point, Point];
  /** RMS distance of members from their centre, per cluster. */
  spreads: [number, number];
  assignment: Int8Array;
  sizes: [number, number];
  separation: number;
}

export const MIN_SEPARATION = 7;
const SEPARATION_SD = 4;

export function kmeans2(points: readonly Point[], iterations = 25): TwoClusters | null {
  if (points.length < 2) return null;
  const mean = centroid(points);
  const a = farthestFrom(points, mean);
  const b = farthestFrom(points, points[a]!);
  let centres: [Point, Point] = [points[a]!, points[b]!];
  const assignment = new Int8Array(points.length);
  for (let it = 0; it < iterations; it++) {
    let changed = false;
    points.forEach((p, i) => {
      const k = dist2(p, centres[0]) <= dist2(p, centres[1]) ? 0 : 1;
      if (assignment[i] !== k) changed = true;
      assignment[i] = k;
    });
    const next: [Point, Point] = [
      centroid(points.filter((_, i) => assignment[i] === 0)),
      centroid(points.filter((_, i) => assignment[i] === 1)),
    ];
    if (Number.isNaN(next[0][0]) || Number.isNaN(next[1][0])) break;
    centres = next;
    if (!changed && it > 0) break;
  }
  const sizes: [number, number] = [0, 0];
  const ss: [number, number] = [0, 0];
  points.forEach((p, i) => {
    const k = assignment[i] as 0 | 1;
    sizes[k]++;
    ss[k] += dist2(p, centres[k]);
  });
  if (sizes[0] === 0 || sizes[1] === 0) return null;
  return {
    centres,
    spreads: [Math.sqrt(ss[0] / sizes[0]), Math.sqrt(ss[1] / sizes[1])],
    assignment,
    sizes,
    separation: Math.sqrt(dist2(centres[0], centres[1])),
  };
}

/** True when the two clusters are distinct colours rather than one colour's spread. */
export function isTwoColours(c: TwoClusters): boolean {
  const n = c.sizes[0] + c.sizes[1];
  const pooled = Math.sqrt((c.sizes[0] * c.spreads[0] ** 2 + c.sizes[1] * c.spreads[1] ** 2) / n);
  return c.separation >= MIN_SEPARATION && c.separation >= SEPARATION_SD * pooled;
}

export function centroid(points: readonly Point[]): Point {
  const s = [0, 0, 0];
  for (const p of points) for (let k = 0; k < 3; k++) s[k]! += p[k]!;
  const n = points.length;
  return [s[0]! / n, s[1]! / n, s[2]! / n];
}

export function dist2(p: Point, q: Point): number {
  return (p[0] - q[0]) ** 2 + (p[1] - q[1]) ** 2 + (p[2] - q[2]) ** 2;
}

function farthestFrom(points: readonly Point[], q: Point): number {
  let best = 0;
  let bestD = -1;
  points.forEach((p, i) => {
    const d = dist2(p, q);
    if (d > bestD) {
      bestD = d;
      best = i;
    }
  });
  return best;
}
