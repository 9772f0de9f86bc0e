/**
 * Two-cluster k-means (Lloyd's algorithm) with a deterministic start, and the test that decides
 * whether a set of colony colours holds one colour or two.
 *
 * Points are colour features (see colour-features.ts). Start: the point farthest from the mean
 * and the point farthest from that one, so the result never depends on a random seed and a 97:3
 * plate still seeds one centre in the small class. The pair is accepted as two colours only when
 * the centres lie at least MIN_SEPARATION feature units apart and Ashman's D along the line
 * joining them, D = √2·|μ₁ − μ₂| / √(σ₁² + σ₂²) (Ashman, Bird & Zepf 1994, AJ 108:2348), is at
 * least MIN_ASHMAN_D. Measured along that line, the spread a colour has across it (lighting,
 * colony size) does not count against the split. Cutting one colour in two gives D ≈ 2.7 for a
 * normal cloud and 3.5 for a uniform one, so a single-colour plate's natural spread does not pass.
 */
export type Point = readonly [number, number, number];

export interface TwoClusters {
  centres: [Point, Point];
  /**
   * Each cluster's RMS distance of members from its centre, estimated from the median distance as
   * a normal cloud would have it (RMS_PER_MEDIAN), so a tail of weak shades or a few strays does
   * not widen it.
   */
  spreads: [number, number];
  assignment: Int8Array;
  sizes: [number, number];
  separation: number;
  /** Ashman's D of the two clusters along the line joining their centres. */
  ashmanD: number;
}

export const MIN_SEPARATION = 7;
const MIN_ASHMAN_D = 4;

/**
 * Below this size a cluster is a stray (a blob of ink, a tinted droplet), not a colour: the
 * farthest-point start seeds a centre on the single most unusual object, so strays are set aside
 * and the split is made again without them (at most MAX_STRAY_ROUNDS times). Set-aside points
 * are then given to the nearer centre; they do not count in the spreads or in D.
 */
const MIN_CLUSTER = 3;
const MAX_STRAY_ROUNDS = 4;

export function kmeans2(points: readonly Point[], iterations = 25): TwoClusters | null {
  let kept = points.map((_, i) => i);
  for (let round = 0; round <= MAX_STRAY_ROUNDS; round++) {
    const fit = lloyd2(
      kept.map((i) => points[i]!),
      iterations,
    );
    if (!fit) return null;
    const strays = new Set(kept.filter((_, j) => fit.sizes[fit.assignment[j]!]! < MIN_CLUSTER));
    if (strays.size === 0 || round === MAX_STRAY_ROUNDS || kept.length - strays.size < 2) {
      return withAllPoints(points, kept, fit);
    }
    kept = kept.filter((i) => !strays.has(i));
  }
  return null;
}

/** The split made on `kept`, with every point of `points` assigned to its nearer centre. */
function withAllPoints(
  points: readonly Point[],
  kept: readonly number[],
  fit: TwoClusters,
): TwoClusters {
  if (kept.length === points.length) return fit;
  const assignment = new Int8Array(points.length);
  points.forEach((p, i) => {
    assignment[i] = dist2(p, fit.centres[0]) <= dist2(p, fit.centres[1]) ? 0 : 1;
  });
  kept.forEach((i, j) => {
    assignment[i] = fit.assignment[j]!;
  });
  const sizes: [number, number] = [0, 0];
  for (const k of assignment) sizes[k as 0 | 1]++;
  return { ...fit, assignment, sizes };
}

/** Lloyd's algorithm for two clusters from the farthest-point start. */
function lloyd2(points: readonly Point[], iterations: number): TwoClusters | null {
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
  for (const k of assignment) sizes[k as 0 | 1]++;
  if (sizes[0] === 0 || sizes[1] === 0) return null;
  const separation = Math.sqrt(dist2(centres[0], centres[1]));
  const spreadOf = (k: 0 | 1) =>
    robustSpread(
      points.filter((_, i) => assignment[i] === k),
      centres[k],
    );
  return {
    centres,
    spreads: [spreadOf(0), spreadOf(1)],
    assignment,
    sizes,
    separation,
    ashmanD: ashmanD(points, assignment, centres, separation),
  };
}

/**
 * RMS over median of the distance from the centre of a three-dimensional normal cloud: that
 * distance follows the chi distribution with 3 degrees of freedom, whose RMS is √3·σ = 1.732σ and
 * whose median is 1.538σ (the square root of the χ²₃ median, 2.366, a handbook table value cited
 * from memory; cluster.test.ts checks the ratio on a sampled normal cloud).
 */
const RMS_PER_MEDIAN = 1.126;

/** A cluster's RMS distance from its centre, estimated from the median distance. */
export function robustSpread(points: readonly Point[], centre: Point): number {
  const d = points.map((p) => Math.sqrt(dist2(p, centre))).sort((a, b) => a - b);
  return RMS_PER_MEDIAN * d[d.length >> 1]!;
}

function ashmanD(
  points: readonly Point[],
  assignment: Int8Array,
  centres: [Point, Point],
  separation: number,
): number {
  if (separation === 0) return 0;
  const axis = [0, 1, 2].map((j) => (centres[1][j]! - centres[0][j]!) / separation);
  const along = (p: Point) => p[0] * axis[0]! + p[1] * axis[1]! + p[2] * axis[2]!;
  const variance = [0, 1].map((k) => {
    const mean = along(centres[k as 0 | 1]);
    let s = 0;
    let n = 0;
    points.forEach((p, i) => {
      if (assignment[i] !== k) return;
      s += (along(p) - mean) ** 2;
      n++;
    });
    return s / n;
  });
  const pooled = Math.sqrt(variance[0]! + variance[1]!);
  return pooled === 0 ? Number.POSITIVE_INFINITY : (Math.SQRT2 * separation) / pooled;
}

/** True when the two clusters are distinct colours rather than one colour's spread. */
export function isTwoColours(c: TwoClusters): boolean {
  return c.separation >= MIN_SEPARATION && c.ashmanD >= MIN_ASHMAN_D;
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
