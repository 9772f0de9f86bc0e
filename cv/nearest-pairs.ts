/**
 * One-to-one matching of reference discs (a true colony, a measured object) to points (a
 * detection, a tapped colony), closest pairs first. A point may pair with a disc when it lies
 * within max(`reach` × the disc's radius, `minPx`) of its centre. Greedy matching by distance is
 * the optimal assignment when discs do not overlap, the usual case for colonies; ties are broken
 * by index, so the result is deterministic.
 *
 * Returns, for each matched disc (by index), the index of its point.
 */
export function nearestPairs(
  discs: readonly { x: number; y: number; r: number }[],
  points: readonly { x: number; y: number }[],
  reach: number,
  minPx: number,
): Map<number, number> {
  const pairs: { d: number; p: number; dist: number }[] = [];
  discs.forEach((disc, d) => {
    const limit = Math.max(minPx, reach * disc.r);
    points.forEach((pt, p) => {
      const dist = Math.hypot(pt.x - disc.x, pt.y - disc.y);
      if (dist <= limit) pairs.push({ d, p, dist });
    });
  });
  pairs.sort((a, b) => a.dist - b.dist || a.d - b.d || a.p - b.p);
  const matched = new Map<number, number>();
  const usedPoints = new Set<number>();
  for (const { d, p } of pairs) {
    if (matched.has(d) || usedPoints.has(p)) continue;
    matched.set(d, p);
    usedPoints.add(p);
  }
  return matched;
}
