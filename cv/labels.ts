import { nearestPairs } from './nearest-pairs.ts';
import type { CandidateFeatures } from './types.ts';

/**
 * Labels from a checked plate: the objects the analysis considered, matched to the colonies the
 * person left on the plate.
 *
 * - kept: the analysis called it a colony and a final colony sits on it, of the same colour;
 * - switched: the same, but the person gave it the other colour;
 * - removed: the analysis called it a colony and the person took it away;
 * - found: the default rules rejected it but the person tapped a colony onto it;
 * - rejected: the default rules rejected it and nobody put a colony there;
 * - added: a final colony on no considered object (nothing was measured there: it teaches no
 *   features, only that the search missed something).
 *
 * Matching is one to one, closest pairs first; a final colony matches an object when it lies
 * within MATCH_REACH of the object's radius from its centre (a tap lands anywhere on the colony),
 * or MATCH_MIN_PX for the smallest.
 */
const MATCH_REACH = 1.2;
const MATCH_MIN_PX = 3;

export interface FinalColony {
  x: number;
  y: number;
  cls: string;
}

export type LabelKind = 'kept' | 'switched' | 'removed' | 'found' | 'rejected' | 'added';

export interface CandidateLabel {
  kind: LabelKind;
  colony: boolean;
  /** The colour the person gave it; null for what is not a colony. */
  cls: string | null;
  /** Null for an added colony (no object was measured there). */
  features: CandidateFeatures | null;
  x: number;
  y: number;
}

/**
 * `analysisCls` gives the colour name the analysis gave an object (by candidate id) when it is
 * known in the person's names; without it kept and switched are not told apart (all kept).
 */
export function labelsFromCorrections(
  candidates: readonly CandidateFeatures[],
  final: readonly FinalColony[],
  analysisCls?: (id: number) => string | undefined,
): CandidateLabel[] {
  const colonyOf = nearestPairs(candidates, final, MATCH_REACH, MATCH_MIN_PX);
  const usedF = new Set(colonyOf.values());
  const labels: CandidateLabel[] = candidates.map((features, c) => {
    const f = colonyOf.get(c);
    const byDefault = features.verdict === 'colony';
    const at = { features, x: features.x, y: features.y };
    if (f === undefined) {
      return { kind: byDefault ? 'removed' : 'rejected', colony: false, cls: null, ...at };
    }
    const cls = final[f]!.cls;
    if (!byDefault) return { kind: 'found', colony: true, cls, ...at };
    const given = analysisCls?.(features.id);
    return {
      kind: given !== undefined && given !== cls ? 'switched' : 'kept',
      colony: true,
      cls,
      ...at,
    };
  });
  final.forEach((col, f) => {
    if (!usedF.has(f)) {
      labels.push({
        kind: 'added',
        colony: true,
        cls: col.cls,
        features: null,
        x: col.x,
        y: col.y,
      });
    }
  });
  return labels;
}
