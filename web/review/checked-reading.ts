import type { Analysis, ColonyRecord, Plate } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { correctedColonies } from './edits.ts';

/** A checked plate's reading (its newest, the one shown) and the colonies after the person's taps. */
export interface CheckedReading {
  analysis: Analysis;
  corrected: ColonyRecord[];
}

/** Null for a plate not checked, typed in by hand, or with no reading on this device. */
export async function checkedReading(
  store: RecordStore,
  plate: Plate,
): Promise<CheckedReading | null> {
  if (!plate.reviewed || !plate.photoId) return null;
  const analysis = (await store.children('analyses', plate.id))
    .sort((a, b) => a.updatedAt.localeCompare(b.updatedAt))
    .at(-1);
  if (!analysis) return null;
  const corrections = (await store.children('corrections', plate.id)).find(
    (c) => c.analysisId === analysis.id,
  );
  return { analysis, corrected: correctedColonies(analysis.colonies, corrections?.edits ?? []) };
}
