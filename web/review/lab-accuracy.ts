import type { RecordStore } from '../storage/record-store.ts';
import { type CountAccuracy, countAccuracy, type ReviewedPlate } from './accuracy.ts';
import { checkedReading } from './checked-reading.ts';

/**
 * How far the automatic counts were from the corrected ones, over every plate the person has
 * marked as checked (demo plates excluded: they would flatter or spoil the lab's own figure):
 * over all of them, and apart for the plates the default analysis read and those read with what
 * their experiment had learned, so the lab sees whether learning helps.
 */
export interface LabAccuracy {
  all: CountAccuracy;
  /** Read by the default analysis (before anything was learned, or with learning off). */
  byDefault: CountAccuracy | null;
  /** Read with a model learned from the experiment's checked plates. */
  learned: CountAccuracy | null;
}

export async function labAccuracy(store: RecordStore): Promise<LabAccuracy | null> {
  const [experiments, plates] = await Promise.all([store.all('experiments'), store.all('plates')]);
  const demo = new Set(experiments.filter((e) => e.demo).map((e) => e.id));
  const byDefault: ReviewedPlate[] = [];
  const learned: ReviewedPlate[] = [];
  for (const plate of plates) {
    if (demo.has(plate.experimentId)) continue;
    const reading = await checkedReading(store, plate);
    if (!reading) continue;
    const reviewed = { found: reading.analysis.colonies, corrected: reading.corrected };
    (reading.analysis.learnedFrom === null ? byDefault : learned).push(reviewed);
  }
  const all = countAccuracy([...byDefault, ...learned]);
  return all && { all, byDefault: countAccuracy(byDefault), learned: countAccuracy(learned) };
}
