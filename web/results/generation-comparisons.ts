import type { AnalysedAssay } from '../../fitness/analysis.ts';
import { type Anova, oneWayAnova, type TTest, welchTTest } from '../../fitness/replicate-stats.ts';

/** The lines measured at one generation, compared with each other on W. */
export interface GenerationComparison {
  generation: number;
  groups: string[];
  test: 'welch' | 'anova';
  result: TTest | Anova;
}

/**
 * What a lab compares across groups: the lines at one generation (Welch's t-test for two groups,
 * one-way ANOVA for more), never every group of every generation at once. Groups with fewer than
 * two assays, and the marker controls, take no part. Each line against the ancestor is the
 * one-sample test of W = 1 beside each group.
 */
export function generationComparisons(
  assays: readonly AnalysedAssay[],
  markerControlGroup: string,
): GenerationComparison[] {
  const byGeneration = new Map<number, Map<string, number[]>>();
  for (const a of assays) {
    if (a.group === markerControlGroup) continue;
    const groups = byGeneration.get(a.generation) ?? new Map<string, number[]>();
    groups.set(a.group, [...(groups.get(a.group) ?? []), a.W]);
    byGeneration.set(a.generation, groups);
  }
  const out: GenerationComparison[] = [];
  for (const [generation, groups] of [...byGeneration].sort((x, y) => x[0] - y[0])) {
    const usable = [...groups]
      .filter(([, w]) => w.length >= 2)
      .sort((x, y) => x[0].localeCompare(y[0]));
    if (usable.length < 2) continue;
    const names = usable.map(([g]) => g);
    const values = usable.map(([, w]) => w);
    const result = usable.length === 2 ? welchTTest(values[0]!, values[1]!) : oneWayAnova(values);
    if (result)
      out.push({
        generation,
        groups: names,
        test: usable.length === 2 ? 'welch' : 'anova',
        result,
      });
  }
  return out;
}
