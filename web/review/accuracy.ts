/** Automatic and corrected counts of one reviewed plate, per colour class. */
export interface ReviewedPlate {
  found: [number, number];
  corrected: [number, number];
}

export interface CountAccuracy {
  plates: number;
  /** Sum over plates and classes of |automatic − corrected| count. */
  countDifference: number;
  correctedTotal: number;
  /**
   * Sum over plates and classes of |automatic − corrected|, over the corrected total: the share
   * of the final count that the automatic count had wrong. A switched colony counts twice (one
   * class too many, the other too few), as it is two errors in the two counts that feed fitness.
   */
  countErrorFraction: number;
  /** Median over plates of the relative error of the plate's total count. */
  medianTotalError: number;
}

export function countAccuracy(plates: readonly ReviewedPlate[]): CountAccuracy | null {
  if (plates.length === 0) return null;
  let changes = 0;
  let total = 0;
  const totalErrors: number[] = [];
  for (const p of plates) {
    changes += Math.abs(p.found[0] - p.corrected[0]) + Math.abs(p.found[1] - p.corrected[1]);
    const t = p.corrected[0] + p.corrected[1];
    total += t;
    const found = p.found[0] + p.found[1];
    totalErrors.push(t === 0 ? (found === 0 ? 0 : 1) : Math.abs(found - t) / t);
  }
  totalErrors.sort((a, b) => a - b);
  const mid = totalErrors.length / 2;
  const median =
    totalErrors.length % 2
      ? totalErrors[Math.floor(mid)]!
      : (totalErrors[mid - 1]! + totalErrors[mid]!) / 2;
  return {
    plates: plates.length,
    countDifference: changes,
    correctedTotal: total,
    countErrorFraction: total === 0 ? 0 : changes / total,
    medianTotalError: median,
  };
}
