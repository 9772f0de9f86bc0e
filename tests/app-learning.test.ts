/**
 * Learning in the app, end to end below the screen: readings stored in IndexedDB (fake-indexeddb
 * runs the same idb code in Node), plates corrected and marked checked, the model refitted by the
 * real worker API over a comlink channel, later plates read with it, learning turned off, reset.
 * Plates come from the seeded generator in fixtures/ (it shares no code with cv/), corrected from
 * its truth as a person would: every true colony left with its colour, everything else removed.
 * The medium is the one with pinpoint colonies that the default rules read poorly.
 */
import 'fake-indexeddb/auto';
import { expose } from 'comlink';
import { describe, expect, it } from 'vitest';
import { analyzePlate } from '../cv/index.ts';
import { generatePlate } from '../fixtures/plate-generator.ts';
import type { GeneratedImage, PlateTruth } from '../fixtures/plate-types.ts';
import { varietyScene } from '../fixtures/scene-variety.ts';
import type { Analysis, Experiment, Plate } from '../schema/records.ts';
import { restoreRecord } from '../schema/restore.ts';
import {
  modelForReading,
  refitModel,
  resetLearning,
  setLearning,
  teachingPlates,
} from '../web/analysis/learning.ts';
import type { PlateWorker } from '../web/analysis/plate-reading.ts';
import { analysisRecord } from '../web/analysis/records.ts';
import { WorkerBridge } from '../web/analysis/worker-bridge.ts';
import { backupJson, readBackup } from '../web/exchange/backup.ts';
import { labAccuracy } from '../web/review/lab-accuracy.ts';
import { markChecked } from '../web/review/mark-checked.ts';
import { openIdbStore } from '../web/storage/idb-store.ts';
import type { RecordStore } from '../web/storage/record-store.ts';
import { newStamp, revised } from '../web/storage/stamp.ts';
import { fitExperimentModel, readModelText } from '../worker/learning.ts';
import { plateApi } from '../worker/plate-api.ts';
import type { PlateWorkerApi } from '../worker/plate-worker.ts';
import { kestrelExperiment } from './support/kestrel-experiment.ts';

const PINPOINT = {
  colonyRadiusMm: [0.16, 0.26] as [number, number],
  colours: 'pink-yellow' as const,
};

function generated(seed: number, colonies: number): { image: GeneratedImage; truth: PlateTruth } {
  return generatePlate(
    varietyScene(seed, { ...PINPOINT, glare: 0, colonies, fractionClass1: 0.4 }),
  );
}

/** The plate worker's real API, exposed on one end of a MessageChannel, as the worker exposes it. */
function channelWorker(): PlateWorker {
  return new WorkerBridge<PlateWorkerApi>({
    create: () => {
      const { port1, port2 } = new MessageChannel();
      expose(plateApi, port2);
      return Object.assign(port1, {
        terminate: () => {
          port1.close();
          port2.close();
        },
      }) as unknown as Worker;
    },
    idleMs: 60_000,
    timeoutMs: 60_000,
  });
}

let stores = 0;

async function setUp() {
  const store = await openIdbStore(`app-learning-${++stores}`);
  const first = generated(701, 150);
  const experiment = kestrelExperiment([
    { name: first.truth.classes[0].name, hex: '#d0607a' },
    { name: first.truth.classes[1].name, hex: '#e8d25a' },
  ]);
  await store.put('experiments', experiment);
  return { store, experiment, first };
}

/** A plate of the experiment read as the app reads it: with the model learning gives, if any. */
async function readNewPlate(
  store: RecordStore,
  experimentId: string,
  image: GeneratedImage,
): Promise<{ plate: Plate; analysis: Analysis }> {
  const experiment = (await store.get('experiments', experimentId))!;
  const plate: Plate = {
    ...newStamp(),
    experimentId,
    assayId: 'kx-assay',
    sampleId: 'kx-sample',
    dilutionFold: 1e5,
    volumeUl: 100,
    photoId: `photo-${crypto.randomUUID()}`,
    typedCounts: null,
    reviewed: false,
  };
  const { model } = modelForReading(experiment);
  const read = await analyzePlate(image, { withCandidates: true, ...(model && { model }) });
  const analysis = analysisRecord(
    read,
    newStamp(),
    plate.id,
    plate.photoId!,
    Boolean(model?.palette),
  );
  await store.putBatch({ plates: [plate], analyses: [analysis] });
  return { plate, analysis };
}

/** The person's taps that leave exactly the true colonies: remove what is not, add what was missed. */
async function correctFromTruth(store: RecordStore, analysis: Analysis, truth: PlateTruth) {
  const left = new Set<string>();
  const add = truth.colonies.filter((t) => {
    const hit = analysis.colonies.find(
      (c) => !left.has(c.id) && Math.hypot(c.x - t.x, c.y - t.y) <= Math.max(3, 1.2 * c.r),
    );
    if (hit && hit.cls === t.cls) left.add(hit.id);
    return !(hit && hit.cls === t.cls);
  });
  await store.put('corrections', {
    ...newStamp(),
    id: analysis.id,
    plateId: analysis.plateId,
    analysisId: analysis.id,
    edits: [
      ...analysis.colonies
        .filter((c) => !left.has(c.id))
        .map((c) => ({ op: 'remove' as const, colonyId: c.id })),
      ...add.map((t, i) => ({
        op: 'add' as const,
        colony: {
          id: `h${i}`,
          x: t.x,
          y: t.y,
          r: t.r,
          cls: t.cls,
          confidence: 1,
          count: 1,
          area: Math.PI * t.r ** 2,
          split: false,
          lab: null,
          deltaLab: null,
        },
      })),
    ],
    undone: [],
  });
}

const experimentOf = async (store: RecordStore, id: string): Promise<Experiment> =>
  (await store.get('experiments', id))!;

describe('learning in the app', () => {
  it('a checked plate teaches the model, the next plate is read with it and checks with fewer corrections', async () => {
    const { store, experiment, first } = await setUp();
    const worker = channelWorker();
    const a = await readNewPlate(store, experiment.id, first.image);
    expect(a.analysis.learnedFrom).toBeNull();
    expect(a.analysis.candidates!.length).toBeGreaterThan(a.analysis.colonies.length);
    await correctFromTruth(store, a.analysis, first.truth);

    const fit = await markChecked(store, worker, experiment, a.plate);
    expect(fit).toMatchObject({ ok: true, plates: 1 });
    const learned = await experimentOf(store, experiment.id);
    const read = readModelText(learned.learning.model!);
    expect(read.ok && read.model.plates).toBe(1);
    expect(read.ok && read.decides).toBe(true);
    // The model is part of the experiment: it goes into a backup, and a phone that pulls the
    // experiment from the lab server (JSON through the one restore gate) reads with it too.
    expect(learned.learning.model!.length).toBeLessThan(4096);
    const { batch } = readBackup(await backupJson(store), 'backup.json');
    const restored = batch.experiments!.find((e) => e.id === experiment.id)!;
    expect(restored.learning).toEqual(learned.learning);
    const pulled = restoreRecord('experiments', JSON.parse(JSON.stringify(learned)), 'the server');
    expect(pulled.ok && modelForReading(pulled.record).model?.plates).toBe(1);

    const second = generated(702, 120);
    const b = await readNewPlate(store, experiment.id, second.image);
    expect(b.analysis.learnedFrom).toBe(1);
    await correctFromTruth(store, b.analysis, second.truth);
    await markChecked(store, worker, learned, b.plate);
    expect(readModelText((await experimentOf(store, experiment.id)).learning.model!)).toMatchObject(
      { ok: true, model: { plates: 2 } },
    );

    const accuracy = (await labAccuracy(store))!;
    console.log(
      `corrections per colony: default analysis ${accuracy.byDefault!.correctionFraction.toFixed(3)}, learned from 1 plate ${accuracy.learned!.correctionFraction.toFixed(3)}`,
    );
    expect(accuracy.byDefault!.plates).toBe(1);
    expect(accuracy.learned!.plates).toBe(1);
    expect(accuracy.learned!.correctionFraction).toBeLessThan(
      accuracy.byDefault!.correctionFraction,
    );
    worker.terminate();
  }, 120_000);

  it('refits the same labels to the same bytes, well under a second for six plates', async () => {
    const { store, experiment, first } = await setUp();
    const a = await readNewPlate(store, experiment.id, first.image);
    await correctFromTruth(store, a.analysis, first.truth);
    await store.put('plates', revised(a.plate, { reviewed: true }));
    const one = await teachingPlates(store, experiment);
    const six = Array.from({ length: 6 }, () => one[0]!);
    const names: [string, string] = [
      experiment.markerColours[0].name,
      experiment.markerColours[1].name,
    ];
    const t0 = performance.now();
    const fit = fitExperimentModel(six, names);
    const ms = performance.now() - t0;
    console.log(
      `refit from six plates of ${one[0]!.candidates.length} objects: ${ms.toFixed(0)} ms`,
    );
    expect(ms).toBeLessThan(1000);
    expect(fit).toEqual(fitExperimentModel(six, names));
  }, 120_000);

  it('learning off keeps the defaults and the model; a reset forgets it and the plates before it', async () => {
    const { store, experiment, first } = await setUp();
    const worker = channelWorker();
    const a = await readNewPlate(store, experiment.id, first.image);
    await correctFromTruth(store, a.analysis, first.truth);
    await markChecked(store, worker, experiment, a.plate);
    const model = (await experimentOf(store, experiment.id)).learning.model;
    expect(model).not.toBeNull();

    await setLearning(store, await experimentOf(store, experiment.id), false);
    const off = await experimentOf(store, experiment.id);
    expect(modelForReading(off)).toEqual({ model: null, error: null });
    expect(off.learning.model).toBe(model);
    const b = await readNewPlate(store, experiment.id, generated(703, 90).image);
    expect(b.analysis.learnedFrom).toBeNull();
    expect(await refitModel(store, worker, experiment.id)).toBeNull();

    await setLearning(store, off, true);
    await resetLearning(store, await experimentOf(store, experiment.id));
    const reset = await experimentOf(store, experiment.id);
    expect(reset.learning.model).toBeNull();
    expect(modelForReading(reset).model).toBeNull();
    // The plate checked before the reset no longer teaches: nothing to refit from.
    expect(await teachingPlates(store, reset)).toEqual([]);
    expect(await refitModel(store, worker, experiment.id)).toBeNull();
    expect((await experimentOf(store, experiment.id)).learning.model).toBeNull();
    worker.terminate();
  }, 120_000);

  it('a stored model that is damaged or from a newer version is named, and the defaults read', async () => {
    const { experiment } = await setUp();
    const newer = {
      ...experiment,
      learning: { enabled: true, model: '{"format":"rivalplate-model","version":9}', since: null },
    };
    expect(modelForReading(newer)).toEqual({
      model: null,
      error: expect.stringMatching(/model version 9 was made by a newer Rivalplate/),
    });
    const damaged = { ...newer, learning: { ...newer.learning, model: '{"format":' } };
    expect(modelForReading(damaged)).toEqual({
      model: null,
      error: expect.stringMatching(/^not a model: not JSON/),
    });
  });
});
