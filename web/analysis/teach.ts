import type { ColonyRecord, Experiment } from '../../schema/records.ts';
import { plateWarnings } from '../bench/plate-warnings.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';
import { pairInNamedOrder } from './class-order.ts';
import { type PlateWorker, reclassifyAll } from './plate-reading.ts';
import { colonyOf, paletteRecord, plateAnalysisOf } from './records.ts';

/**
 * Teaches the experiment's two marker colours from one tapped colony of each (the first of the
 * first named colour), then re-sorts the plates not yet checked against them. Resolves to the
 * number of checked plates left as they were. Throws when a tapped colony was added by hand (it
 * has no measured colour).
 */
export async function teachColours(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
  first: ColonyRecord,
  second: ColonyRecord,
  names: [string, string],
): Promise<number> {
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
  const { unchecked, checked } = await experimentAnalyses(store, experiment.id);
  await reclassifyAll(store, worker, palette, unchecked);
  return checked.length;
}

/**
 * Learns the two marker colours from every plate the person has checked that carries no warning
 * on the whole plate (more plates give a steadier palette than one alone; an unchecked plate, or
 * one with glare, no dish or one colour, may be a bad one), puts them in the order
 * of the experiment's names, then re-sorts the plates not yet checked: a checked plate keeps the
 * counts the person checked. Resolves to false when those plates do not show two colours.
 */
export async function learnColours(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
): Promise<boolean> {
  const { unchecked, checked } = await experimentAnalyses(store, experiment.id);
  const clean = checked.filter((a) => plateWarnings(a.flags, a.colonies.length).length === 0);
  const learned = await worker.call((api) => api.learnPalette(clean.map(plateAnalysisOf)));
  if (!learned) return false;
  const palette = {
    ...learned,
    colours: pairInNamedOrder(learned.colours, experiment.markerColours),
  };
  await store.put(
    'experiments',
    revised(experiment, { palette: paletteRecord(palette, 'learned') }),
  );
  await reclassifyAll(store, worker, palette, unchecked);
  return true;
}

/** The experiment's readings, on plates the person has checked and on the others. */
async function experimentAnalyses(store: RecordStore, experimentId: string) {
  const plates = await store.children('plates', experimentId);
  const of = async (reviewed: boolean) =>
    (
      await Promise.all(
        plates.filter((p) => p.reviewed === reviewed).map((p) => store.children('analyses', p.id)),
      )
    ).flat();
  return { unchecked: await of(false), checked: await of(true) };
}
