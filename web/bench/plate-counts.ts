import type { Analysis, Assay, Corrections, Plate } from '../../schema/records.ts';
import { correctedColonies, countsByClass } from '../review/edits.ts';

export interface PlateCount {
  test: number;
  reference: number;
  source: 'typed' | 'photo';
  /** Colonies per colour class as the analysis found them, before corrections. */
  found: [number, number] | null;
}

/**
 * A plate's counts of the test and the reference strain: typed in by hand, or from its photo's
 * analysis with the person's corrections applied. Null while there is neither.
 */
export function plateCount(
  plate: Plate,
  assay: Assay,
  analysis: Analysis | undefined,
  corrections: Corrections | undefined,
): PlateCount | null {
  if (plate.typedCounts) return { ...plate.typedCounts, source: 'typed', found: null };
  if (!analysis) return null;
  const edits = corrections?.analysisId === analysis.id ? corrections.edits : [];
  const byClass = countsByClass(correctedColonies(analysis.colonies, edits));
  const t = assay.testClass;
  return {
    test: byClass[t],
    reference: byClass[t === 0 ? 1 : 0],
    source: 'photo',
    found: countsByClass(analysis.colonies),
  };
}
