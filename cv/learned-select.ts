import type { Candidate } from './candidates.ts';
import { colonyProbability } from './learned-model.ts';
import type { RegionStats } from './measure.ts';
import type { CandidateFeatures, LearnedModel } from './types.ts';

/**
 * The colonies a learned model keeps among every object considered: those it gives a probability
 * of at least one half. An object the default rules kept keeps their split and clump estimate; one
 * they rejected counts as one colony.
 */
export function learnedCandidates(
  model: LearnedModel,
  considered: readonly CandidateFeatures[],
  regions: readonly RegionStats[],
  defaults: readonly Candidate[],
): Candidate[] {
  const byId = new Map(regions.map((r) => [r.id, r]));
  const kept = new Map(defaults.map((c) => [c.region.id, c]));
  return considered
    .filter((f) => colonyProbability(model, f) >= 0.5)
    .map((f) => kept.get(f.id) ?? { region: byId.get(f.id)!, split: false, count: 1 });
}
