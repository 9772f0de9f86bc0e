import type { Experiment, Plate } from '../../schema/records.ts';
import type { FitResult } from '../../worker/learning.ts';
import { refitModel } from '../analysis/learning.ts';
import type { PlateWorker } from '../analysis/plate-reading.ts';
import { learnColours } from '../analysis/teach.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';

/**
 * The person vouches for the plate's count. While the experiment has no colours learned, the
 * checked plates teach them (learnColours takes checked plates without warnings only). While it
 * learns, the model is refitted from all its checked plates, this one included (learning.ts).
 * Resolves to that fit (null when learning is off or nothing teaches).
 */
export async function markChecked(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
  plate: Plate,
): Promise<FitResult | null> {
  await store.put('plates', revised(plate, { reviewed: true }));
  if (!experiment.palette) await learnColours(store, worker, experiment);
  return refitModel(store, worker, experiment.id);
}
