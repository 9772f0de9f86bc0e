import type { Candidate } from './candidates.ts';
import { colonyProbability, isColony } from './learned-model.ts';
import type { RegionStats } from './measure.ts';
import type { CandidateFeatures, LearnedModel, QualityFlag } from './types.ts';

/**
 * The colonies a learned model keeps among every object considered: those it gives a probability
 * of at least one half where it may overrule the default rules (learned-model.ts, isColony), and
 * elsewhere those the default rules keep. An object the default rules kept keeps their split and clump estimate; one
 * they rejected counts as one colony.
 *
 * Learning never hides a mistake: where the model and the default rules disagree on more than
 * DISAGREE_SHARE of the default colonies (and more than DISAGREE_MIN objects), the plate carries
 * a 'learned-differs' flag with what the model added and dropped, so the person looks. And where
 * the model would drop that many of the colonies the default rules kept, it is reading something
 * unlike the plates it learned from: it keeps the default colonies and only adds the objects it
 * found, so a plate is never read much worse than the defaults read it (on one set of photos a
 * model learned from three plates otherwise dropped 467 of 493 colonies of a crowded plate).
 *
 * Nor does it add more than its labels can vouch for: on the checked plates a share of the
 * colonies were objects the default rules had rejected (`examples.found`). A plate gets at most
 * as many additions as that share implies beside its other colonies, the most probable first.
 * Unbounded, a model learned from three plates (1 of their 55 colonies rescued) proposed 32
 * additions to a plates-dev photo of 250 colonies (see boundedAdditions).
 */
export const DISAGREE_SHARE = 0.2;
export const DISAGREE_MIN = 3;

export function learnedCandidates(
  model: LearnedModel,
  considered: readonly CandidateFeatures[],
  regions: readonly RegionStats[],
  defaults: readonly Candidate[],
): { candidates: Candidate[]; flag: QualityFlag | null } {
  const byId = new Map(regions.map((r) => [r.id, r]));
  const kept = new Map(defaults.map((c) => [c.region.id, c]));
  const wanted = considered.filter((f) => isColony(model, f));
  const proposed = wanted.filter((f) => !kept.has(f.id));
  const additions = boundedAdditions(model, proposed, wanted.length - proposed.length);
  const chosen = wanted.filter((f) => kept.has(f.id) || additions.has(f));
  const added = additions.size;
  const dropped = defaults.length - (chosen.length - added);
  const limit = Math.max(DISAGREE_MIN, DISAGREE_SHARE * defaults.length);
  const differs = added + dropped > limit;
  const fromModel = chosen.map(
    (f) => kept.get(f.id) ?? { region: byId.get(f.id)!, split: false, count: 1 },
  );
  const addedOnly = chosen
    .filter((f) => !kept.has(f.id))
    .map((f) => ({ region: byId.get(f.id)!, split: false, count: 1 }));
  return {
    candidates: dropped > limit ? [...defaults, ...addedOnly] : fromModel,
    flag: differs ? { kind: 'learned-differs', added, dropped } : null,
  };
}

/**
 * The additions a plate may take: all of them for a model that did not record what its labels
 * rescued, else the most probable, up to as many as the rescued share implies beside `others`
 * colonies (a share s of all colonies gives s / (1 − s) per other colony). The share's point
 * estimate, not an upper bound: from three plates with a single rescued colony, a 95 % upper
 * bound still let 24 objects onto that photo, all of them false.
 */
function boundedAdditions(
  model: LearnedModel,
  candidates: readonly CandidateFeatures[],
  others: number,
): Set<CandidateFeatures> {
  const found = model.examples.found;
  if (found === undefined) return new Set(candidates);
  const share = found / Math.max(1, model.examples.colonies);
  const limit = share >= 1 ? Number.POSITIVE_INFINITY : Math.ceil((others * share) / (1 - share));
  const ranked = candidates
    .map((f) => ({ f, p: colonyProbability(model, f) }))
    .sort((a, b) => b.p - a.p || a.f.id - b.f.id);
  return new Set(ranked.slice(0, limit).map((r) => r.f));
}
