import { describe, expect, it } from 'vitest';
import type { Candidate } from './candidates.ts';
import { coloniesNeeded, FEATURE_NAMES, isColony } from './learned-model.ts';
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

describe('the bound on what a learned model adds', () => {
  const addsAll: LearnedModel = { ...rejectsAll, intercept: 100, removedRange: null };
  const plate = () => {
    const kept = Array.from({ length: 100 }, (_, i) => object(i + 1, 'colony'));
    const rejected = Array.from({ length: 60 }, (_, i) => ({
      ...object(i + 101, 'rejected'),
      dE: 5 + i, // the more contrast, the likelier a colony under the weights below
    }));
    const considered = [...kept, ...rejected];
    const defaults: Candidate[] = kept.map((f) => ({
      region: region(f.id),
      split: false,
      count: 1,
    }));
    return { considered, defaults, regions: considered.map((f) => region(f.id)) };
  };

  it('adds no more than the share its labels rescued implies, the most probable first', () => {
    // 60 of 1200 labelled colonies were objects the rules had rejected, a share of 0.05: 100
    // other colonies take at most ceil(100 · 0.05 / 0.95) = 6 additions.
    const model: LearnedModel = {
      ...addsAll,
      examples: { colonies: 1200, other: 100, found: 60 },
      intercept: -3,
      weights: FEATURE_NAMES.map((f) => (f === 'dE' ? 0.1 : 0)),
    };
    const { considered, defaults, regions } = plate();
    const { candidates } = learnedCandidates(model, considered, regions, defaults);
    const added = candidates.filter((c) => c.region.id > 100).map((c) => c.region.id);
    expect(added).toHaveLength(6);
    expect(added.sort((a, b) => a - b)).toEqual([155, 156, 157, 158, 159, 160]);
  });

  it('leaves a model that did not record its rescues unbounded', () => {
    const { considered, defaults, regions } = plate();
    const { candidates } = learnedCandidates(addsAll, considered, regions, defaults);
    expect(candidates).toHaveLength(160);
  });
});

describe('overruling the default rules', () => {
  // The events-per-variable rule (learned-model.ts decidesColonies) asked of each decision's
  // rare outcome: objects people removed for drops, colonies they found among the rejected for
  // additions.
  const need = coloniesNeeded(rejectsAll);
  const kept = object(1, 'colony');
  const rejected = object(2, 'rejected');

  it('drops a kept object only with enough removed ones among its labels', () => {
    const few = { ...rejectsAll, examples: { colonies: 1000, other: 1000, removed: need - 1 } };
    const enough = { ...few, examples: { ...few.examples, removed: need } };
    expect(isColony(few, kept)).toBe(true);
    expect(isColony(enough, kept)).toBe(false);
  });

  it('adds a rejected object only with enough rescued ones, but judges what only it found', () => {
    const addsAll = { ...rejectsAll, intercept: 100 };
    const few = { ...addsAll, examples: { colonies: 1000, other: 1000, found: need - 1 } };
    const enough = { ...few, examples: { ...few.examples, found: need } };
    expect(isColony(few, rejected)).toBe(false);
    expect(isColony(enough, rejected)).toBe(true);
    expect(isColony(few, { ...rejected, wider: true })).toBe(true);
  });

  it('holds a model from before the counts were kept to its ranges only, as then', () => {
    expect(isColony(rejectsAll, kept)).toBe(false);
    expect(isColony({ ...rejectsAll, intercept: 100 }, rejected)).toBe(true);
  });
});
