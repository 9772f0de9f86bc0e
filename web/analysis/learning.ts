import type { Experiment, LearningRecord } from '../../schema/records.ts';
import { type FitResult, readModelText, type TeachingPlate } from '../../worker/learning.ts';
import type { LearnedModel } from '../../worker/types.ts';
import { checkedReading } from '../review/checked-reading.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';
import type { PlateWorker } from './plate-reading.ts';
import { candidateFeaturesOf } from './records.ts';

/**
 * Learning from the lab's own corrections, per experiment. Each checked plate's reading keeps every
 * object the analysis considered (Analysis.candidates); with the colonies the person left, they
 * label those objects (kept, removed, found, ...), and the experiment's model is fitted afresh from
 * all of them in the worker after every checked plate. The photo is never needed again.
 */

/**
 * What each checked plate of the experiment teaches: readings that kept their candidates, made
 * since the last reset. A colony's colour is the experiment's name for it.
 */
export async function teachingPlates(
  store: RecordStore,
  experiment: Experiment,
): Promise<TeachingPlate[]> {
  const since = experiment.learning.since;
  const names = experiment.markerColours.map((m) => m.name);
  const out: TeachingPlate[] = [];
  for (const plate of await store.children('plates', experiment.id)) {
    const reading = await checkedReading(store, plate);
    const candidates = reading?.analysis.candidates;
    if (!reading || !candidates) continue;
    if (since !== null && reading.analysis.updatedAt <= since) continue;
    out.push({
      readByDefaults: reading.analysis.learnedFrom === null,
      candidates: candidateFeaturesOf(candidates),
      final: reading.corrected.map((c) => ({ x: c.x, y: c.y, cls: names[c.cls]! })),
    });
  }
  return out;
}

/**
 * Refits the experiment's model from all its checked plates and stores it on the experiment
 * (null when they teach nothing yet). Does nothing while learning is off. Resolves to the fit,
 * or null when learning is off or no plate teaches.
 */
export async function refitModel(
  store: RecordStore,
  worker: PlateWorker,
  experimentId: string,
): Promise<FitResult | null> {
  const experiment = await store.get('experiments', experimentId);
  if (!experiment?.learning.enabled) return null;
  const plates = await teachingPlates(store, experiment);
  const names: [string, string] = [
    experiment.markerColours[0].name,
    experiment.markerColours[1].name,
  ];
  // Kept when no plate read by the defaults says how far the search falls short.
  const current = experiment.learning.model ? readModelText(experiment.learning.model) : null;
  const reach = current?.ok ? current.model.reach : 1;
  const fit =
    plates.length > 0
      ? await worker.call<FitResult>((api) => api.fitModel(plates, names, reach))
      : null;
  const model = fit?.ok ? fit.model : null;
  // Read again: the fit ran in the worker, and the record may have changed meanwhile.
  const latest = await store.get('experiments', experimentId);
  if (latest?.learning.enabled && latest.learning.model !== model)
    await store.put('experiments', revised(latest, { learning: { ...latest.learning, model } }));
  return fit;
}

/** Turns learning on or off; the model is kept (off only stops using and refitting it). */
export function setLearning(store: RecordStore, experiment: Experiment, enabled: boolean) {
  return changeLearning(store, experiment, { enabled });
}

/** Forgets the model; the plates checked so far no longer teach, the next checked ones do. */
export function resetLearning(store: RecordStore, experiment: Experiment, now = new Date()) {
  return changeLearning(store, experiment, { model: null, since: now.toISOString() });
}

function changeLearning(
  store: RecordStore,
  experiment: Experiment,
  change: Partial<LearningRecord>,
): Promise<void> {
  return store.put(
    'experiments',
    revised(experiment, { learning: { ...experiment.learning, ...change } }),
  );
}

/**
 * The model a new reading of the experiment's plates uses: none while learning is off or nothing
 * is learned, and none (with the reason) when the stored model cannot be read.
 */
export function modelForReading(experiment: Experiment): {
  model: LearnedModel | null;
  error: string | null;
} {
  const { enabled, model } = experiment.learning;
  if (!enabled || model === null) return { model: null, error: null };
  const read = readModelText(model);
  return read.ok ? { model: read.model, error: null } : { model: null, error: read.error };
}
