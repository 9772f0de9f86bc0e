import type { RecordStore } from '../storage/record-store.ts';
import { type CountAccuracy, countAccuracy, type ReviewedPlate } from './accuracy.ts';
import { correctedColonies } from './edits.ts';

/**
 * How far the automatic counts were from the corrected ones, over every plate the person has
 * marked as checked (demo plates excluded: they would flatter or spoil the lab's own figure).
 */
export async function labAccuracy(store: RecordStore): Promise<CountAccuracy | null> {
  const [experiments, plates] = await Promise.all([store.all('experiments'), store.all('plates')]);
  const demo = new Set(experiments.filter((e) => e.demo).map((e) => e.id));
  const reviewed: ReviewedPlate[] = [];
  for (const plate of plates) {
    if (!plate.reviewed || !plate.photoId || demo.has(plate.experimentId)) continue;
    const analysis = (await store.children('analyses', plate.id))
      .sort((a, b) => a.updatedAt.localeCompare(b.updatedAt))
      .at(-1);
    if (!analysis) continue;
    const corrections = (await store.children('corrections', plate.id)).find(
      (c) => c.analysisId === analysis.id,
    );
    reviewed.push({
      found: analysis.colonies,
      corrected: correctedColonies(analysis.colonies, corrections?.edits ?? []),
    });
  }
  return countAccuracy(reviewed);
}
