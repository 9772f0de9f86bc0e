import type { Experiment, Plate } from '../../schema/records.ts';
import type { PlateWorker } from '../analysis/plate-reading.ts';
import { learnColours } from '../analysis/teach.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';

/**
 * The person vouches for the plate's count. While the experiment has no colours learned, the
 * checked plates teach them (learnColours takes checked plates without warnings only).
 */
export async function markChecked(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
  plate: Plate,
): Promise<void> {
  await store.put('plates', revised(plate, { reviewed: true }));
  if (!experiment.palette) await learnColours(store, worker, experiment);
}
