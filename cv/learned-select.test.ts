import { describe, expect, it } from 'vitest';
import type { Candidate } from './candidates.ts';
import { FEATURE_NAMES } from './learned-model.ts';
import { learnedCandidates } from './learned-select.ts';
import type { RegionStats } from './measure.ts';
import type { CandidateFeatures, LearnedModel } from './types.ts';

const n = FEATURE_NAMES.length;
const everywhere = { low: Array(n).fill(-1e9), high: Array(n).fill(1e9) };
/** A model that would call everything "not a colony" wherever it may overrule the rules. */
const rejectsAll: LearnedModel = {
  format: 'rivalplate-model',
  version: 1,
  plates: 3,
  examples: { colonies: 1000, other: 1000 },
  features: [...FEATURE_NAMES],
  mean: Array(n).fill(0),
  sd: Array(n).fill(1),
  colonyRange: everywhere,
  removedRange: everywhere,
  intercept: -100,
  weights: Array(n).fill(0),
  lambda: 1,
  reach: 1,
  palette: null,
};

function object(id: number, verdict: 'colony' | 'rejected'): CandidateFeatures {
  return {
    id,
    x: id,
    y: id,
    r: 5,
    dL: -20,
    da: 5,
    db: 5,
    dE: 21,
    radiusMm: 0.5,
    elongation: 1,
    ridgeVariation: 0,
    wallMm: 10,
    verdict,
    plateColonies: 20,
  };
}
const region = (id: number) => ({ id }) as RegionStats;

describe('a learned model on a plate unlike those it learned from', () => {
  it('may not drop most of the colonies the default rules kept: it keeps them, and says so', () => {
    const considered = Array.from({ length: 20 }, (_, i) => object(i + 1, 'colony'));
    const defaults: Candidate[] = considered.map((f) => ({
      region: region(f.id),
      split: false,
      count: 1,
    }));
    const { candidates, flag } = learnedCandidates(
      rejectsAll,
      considered,
      considered.map((f) => region(f.id)),
      defaults,
    );
    expect(candidates).toHaveLength(20);
    expect(flag).toEqual({ kind: 'learned-differs', added: 0, dropped: 20 });
  });
});
