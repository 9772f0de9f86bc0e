import type { ClassIndex, ColonyRecord, Edit } from '../../schema/records.ts';

/** Below this the analysis was unsure of a colony's colour. */
export const UNSURE_CONFIDENCE = 0.75;

/** Found by the analysis (not added by hand) with a colour it was unsure of. */
export function isUnsure(c: ColonyRecord): boolean {
  return c.lab !== null && c.confidence < UNSURE_CONFIDENCE;
}

/** The colonies to step through, least sure first. */
export function unsureQueue(colonies: readonly ColonyRecord[]): string[] {
  return colonies
    .filter(isUnsure)
    .sort((a, b) => a.confidence - b.confidence)
    .map((c) => c.id);
}

/** The person's answer about one colony: its colour, or that it is not a colony at all. */
export type UnsureAnswer = ClassIndex | 'not-a-colony';

/** The edit an answer makes; none when the analysis had the colour right. */
export function editForAnswer(colony: ColonyRecord, answer: UnsureAnswer): Edit | null {
  if (answer === 'not-a-colony') return { op: 'remove', colonyId: colony.id };
  return answer === colony.cls ? null : { op: 'reclass', colonyId: colony.id, cls: answer };
}

/** Where a step-through stands: its queue of colony ids, taken when it began, and the next place. */
export interface UnsureWalk {
  queue: string[];
  at: number;
}

/**
 * The colony the step-through shows now: the first at or after `at` still on the plate (one
 * removed meanwhile is passed over), with its place in the queue; null when the queue is done.
 */
export function currentUnsure(
  walk: UnsureWalk,
  colonies: readonly ColonyRecord[],
): { colony: ColonyRecord; index: number } | null {
  const byId = new Map(colonies.map((c) => [c.id, c]));
  for (let i = walk.at; i < walk.queue.length; i++) {
    const colony = byId.get(walk.queue[i]!);
    if (colony) return { colony, index: i };
  }
  return null;
}
