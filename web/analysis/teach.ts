import type { ColonyRecord, Experiment } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';
import { type PlateWorker, reclassifyAll } from './plate-reading.ts';
import { colonyOf, paletteRecord, plateAnalysisOf } from './records.ts';

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
  await reclassifyAll(store, worker, palette, await experimentAnalyses(store, experiment.id));
}

/**
 * Learns the two marker colours from every plate of the experiment read so far (more plates give
 * a steadier palette than the first one alone), then re-sorts them all against it. Resolves to
 * false when the plates do not show two colours to learn from.
 */
export async function learnColours(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
): Promise<boolean> {
  const analyses = await experimentAnalyses(store, experiment.id);
  const palette = await worker.call((api) => api.learnPalette(analyses.map(plateAnalysisOf)));
  if (!palette) return false;
  await store.put(
    'experiments',
    revised(experiment, { palette: paletteRecord(palette, 'learned') }),
  );
  await reclassifyAll(store, worker, palette, analyses);
  return true;
}

async function experimentAnalyses(store: RecordStore, experimentId: string) {
  const plates = await store.children('plates', experimentId);
  return (await Promise.all(plates.map((p) => store.children('analyses', p.id)))).flat();
}
