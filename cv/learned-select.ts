import type { Candidate } from './candidates.ts';
import { isColony } from './learned-model.ts';
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
 */
const DISAGREE_SHARE = 0.2;
const DISAGREE_MIN = 3;

export function learnedCandidates(
  model: LearnedModel,
  considered: readonly CandidateFeatures[],
  regions: readonly RegionStats[],
  defaults: readonly Candidate[],
): { candidates: Candidate[]; flag: QualityFlag | null } {
  const byId = new Map(regions.map((r) => [r.id, r]));
  const kept = new Map(defaults.map((c) => [c.region.id, c]));
  const chosen = considered.filter((f) => isColony(model, f));
  const added = chosen.filter((f) => !kept.has(f.id)).length;
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
