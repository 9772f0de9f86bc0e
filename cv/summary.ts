import { LOW_CONFIDENCE } from './classify.ts';
import type { Colony, ColourClass, QualityFlag } from './types.ts';

/** Colony totals per class name; an estimated clump adds its estimated count. */
export function countsByClass(
  colonies: readonly Colony[],
  classes: readonly ColourClass[],
): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const c of classes) counts[c.name] = 0;
  for (const col of colonies) {
    const name = classes[col.cls]?.name ?? `class ${col.cls}`;
    counts[name] = (counts[name] ?? 0) + col.count;
  }
  return counts;
}

/** Flags that follow from the colonies alone (clumps, doubtful colours, one-colour plates). */
export function colonyFlags(
  colonies: readonly Colony[],
  oneColour: string | null,
  outliers: number,
): QualityFlag[] {
  const flags: QualityFlag[] = [];
  if (outliers > 0) flags.push({ kind: 'colour-outliers', colonies: outliers });
  const clumps = colonies.filter((c) => c.count > 1);
  if (clumps.length > 0) {
    flags.push({
      kind: 'clumps-estimated',
      clumps: clumps.length,
      colonies: clumps.reduce((s, c) => s + c.count, 0),
    });
  }
  const doubtful = colonies.filter((c) => c.confidence < LOW_CONFIDENCE).length;
  if (doubtful > 0) flags.push({ kind: 'low-confidence', colonies: doubtful });
  if (oneColour && colonies.length > 0) flags.push({ kind: 'one-colour', reason: oneColour });
  return flags;
}

const COLONY_FLAGS = new Set<QualityFlag['kind']>([
  'clumps-estimated',
  'low-confidence',
  'one-colour',
  // Said of a learned model's colours: colonies sorted again by a palette are no longer its.
  'learned-recolours',
]);

/** The image flags of an analysis, without those recomputed from colonies. */
export function imageFlags(flags: readonly QualityFlag[]): QualityFlag[] {
  return flags.filter((f) => !COLONY_FLAGS.has(f.kind));
}
