import type { ColonyRecord, Experiment } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';
import { type PlateWorker, reclassifyAll } from './plate-reading.ts';
import { colonyOf, paletteRecord } from './records.ts';

/**
 * Teaches the experiment's two marker colours from one tapped colony of each, then re-sorts
 * every analysed plate of the experiment against them. Throws when a tapped colony was added by
 * hand (it has no measured colour).
 */
export async function teachColours(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
  first: ColonyRecord,
  second: ColonyRecord,
  names: [string, string],
): Promise<void> {
  const toColony = (c: ColonyRecord) => {
    const one = colonyOf(c);
    if (!one)
      throw new Error('a colony added by hand has no measured colour: tap one the analysis found');
    return one;
  };
  const palette = await worker.call((api) =>
    api.teachPalette(toColony(first), toColony(second), names),
  );
  await store.put(
    'experiments',
    revised(experiment, { palette: paletteRecord(palette, 'taught') }),
  );
  const plates = await store.children('plates', experiment.id);
  const analyses = (await Promise.all(plates.map((p) => store.children('analyses', p.id)))).flat();
  await reclassifyAll(store, worker, palette, analyses);
}
