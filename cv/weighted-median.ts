/**
 * The weighted median: the value at which the items' weights, taken in order of value, reach
 * half their total; where they reach it exactly between two items, the mean of the two (so two
 * items of equal weight give their mean, as the ordinary median of an even count does). Robust
 * to a minority of odd items, as a weighted mean is not. "Exactly" is exact: the weights used
 * here (areas in pixels, colony counts) are whole numbers, so their sums are exact.
 */
export function weightedMedian(items: readonly { value: number; weight: number }[]): number {
  const sorted = [...items].sort((a, b) => a.value - b.value);
  const half = sorted.reduce((s, i) => s + i.weight, 0) / 2;
  let run = 0;
  for (let i = 0; i < sorted.length; i++) {
    run += sorted[i]!.weight;
    if (run === half && i + 1 < sorted.length) return (sorted[i]!.value + sorted[i + 1]!.value) / 2;
    if (run >= half) return sorted[i]!.value;
  }
  return sorted[sorted.length - 1]!.value;
}
