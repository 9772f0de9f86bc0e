/**
 * Scores detected colonies against a generated plate's ground truth.
 *
 * Matching is greedy by distance: each true colony goes to the nearest unused detection whose
 * centre lies within the larger of the two radii (plus one pixel). A detection that stands for an
 * estimated clump of n colonies may take n true colonies. Class accuracy is measured under the
 * better of the two ways of pairing detected and true class labels, since a plate clustered on its
 * own cannot know which colour the experimenter calls "class 0".
 */
export interface TruthLike {
  x: number;
  y: number;
  r: number;
  cls: 0 | 1;
}

export interface DetectionLike {
  x: number;
  y: number;
  r: number;
  cls: number;
  count: number;
}

export interface Score {
  truth: number;
  detected: number;
  matched: number;
  recall: number;
  precision: number;
  /** (detected total − true total) / true total, clump estimates included. */
  countError: number;
  classAccuracy: number;
  /** True when detected class k corresponds to true class 1 − k. */
  swapped: boolean;
}

export function scoreDetections(truth: readonly TruthLike[], found: readonly DetectionLike[]): Score {
  const pairs: { t: number; d: number; dist: number }[] = [];
  truth.forEach((t, ti) => {
    found.forEach((d, di) => {
      const dist = Math.hypot(t.x - d.x, t.y - d.y);
      if (dist <= Math.max(t.r, d.r) + 1) pairs.push({ t: ti, d: di, dist });
    });
  });
  pairs.sort((a, b) => a.dist - b.dist);
  const capacity = found.map((d) => d.count);
  const truthMatch = new Array<number>(truth.length).fill(-1);
  for (const p of pairs) {
    if (truthMatch[p.t] !== -1 || capacity[p.d]! <= 0) continue;
    truthMatch[p.t] = p.d;
    capacity[p.d]!--;
  }
  const matched = truthMatch.filter((d) => d !== -1).length;
  const usedDetections = new Set(truthMatch.filter((d) => d !== -1)).size;
  let same = 0;
  let crossed = 0;
  truthMatch.forEach((d, ti) => {
    if (d === -1) return;
    if (found[d]!.cls === truth[ti]!.cls) same++;
    else crossed++;
  });
  const detectedTotal = found.reduce((s, d) => s + d.count, 0);
  return {
    truth: truth.length,
    detected: detectedTotal,
    matched,
    recall: truth.length ? matched / truth.length : 1,
    precision: found.length ? usedDetections / found.length : 1,
    countError: truth.length ? (detectedTotal - truth.length) / truth.length : detectedTotal,
    classAccuracy: matched ? Math.max(same, crossed) / matched : 1,
    swapped: crossed > same,
  };
}
