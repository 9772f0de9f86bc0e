import { describe, expect, it } from 'vitest';
import type { AnalysedAssay } from '../../fitness/analysis.ts';
import { oneWayAnova, welchTTest } from '../../fitness/replicate-stats.ts';
import { generationComparisons } from './generation-comparisons.ts';

const assay = (group: string, generation: number, W: number) =>
  ({ group, generation, W }) as AnalysedAssay;

describe('groups are compared within a generation', () => {
  it('two lines at one generation: Welch; three: ANOVA; generations are never mixed', () => {
    const assays = [
      assay('L1 g500', 500, 1.1),
      assay('L1 g500', 500, 1.12),
      assay('L2 g500', 500, 1.2),
      assay('L2 g500', 500, 1.25),
      assay('L1 g1000', 1000, 1.3),
      assay('L1 g1000', 1000, 1.28),
      assay('L2 g1000', 1000, 1.31),
      assay('L2 g1000', 1000, 1.35),
      assay('L3 g1000', 1000, 1.4),
      assay('L3 g1000', 1000, 1.42),
      assay('marker-control', 1000, 1.0),
      assay('marker-control', 1000, 1.01),
      // One assay alone cannot take part.
      assay('L4 g1000', 1000, 1.5),
    ];
    const out = generationComparisons(assays, 'marker-control');
    expect(out.map((c) => [c.generation, c.test, c.groups])).toEqual([
      [500, 'welch', ['L1 g500', 'L2 g500']],
      [1000, 'anova', ['L1 g1000', 'L2 g1000', 'L3 g1000']],
    ]);
    // The same tests as the engine's, on the same values.
    expect(out[0]!.result.p).toBe(welchTTest([1.1, 1.12], [1.2, 1.25])!.p);
    expect(out[1]!.result.p).toBe(
      oneWayAnova([
        [1.3, 1.28],
        [1.31, 1.35],
        [1.4, 1.42],
      ])!.p,
    );
  });
});
