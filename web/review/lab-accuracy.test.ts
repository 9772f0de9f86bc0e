import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import type { Analysis, ColonyRecord, Edit, Plate } from '../../schema/records.ts';
import { kestrelExperiment } from '../../tests/support/kestrel-experiment.ts';
import { openIdbStore } from '../storage/idb-store.ts';
import { newStamp } from '../storage/stamp.ts';
import { labAccuracy } from './lab-accuracy.ts';

const colony = (i: number): ColonyRecord => ({
  id: `c${i}`,
  x: 10 * i,
  y: 10,
  r: 4,
  cls: 0,
  confidence: 0.9,
  count: 1,
  area: 50,
  split: false,
  lab: [50, 0, 0],
  deltaLab: [-10, 0, 0],
});

/** A checked plate whose reading found `found` colonies, then corrected by `edits`. */
async function checkedPlate(
  store: Awaited<ReturnType<typeof openIdbStore>>,
  experimentId: string,
  found: number,
  edits: Edit[],
  learnedFrom: number | null,
) {
  const plate: Plate = {
    ...newStamp(),
    experimentId,
    assayId: 'a',
    sampleId: 's',
    dilutionFold: 1e5,
    volumeUl: 100,
    photoId: 'ph',
    typedCounts: null,
    reviewed: true,
  };
  const analysis: Analysis = {
    ...newStamp(),
    plateId: plate.id,
    photoId: 'ph',
    width: 400,
    height: 400,
    agarLab: [80, 0, 10],
    dish: null,
    colonies: Array.from({ length: found }, (_, i) => colony(i)),
    classes: [
      { cls: 0, name: 'pink', hex: '#d0607a', deltaLab: [0, 20, 0] },
      { cls: 1, name: 'cream', hex: '#efe3d3', deltaLab: [2, 0, 5] },
    ],
    flags: [],
    paletteUsed: false,
    ms: 1,
    learnedFrom,
    candidates: null,
  };
  const corrections = {
    ...newStamp(),
    plateId: plate.id,
    analysisId: analysis.id,
    edits,
    undone: [],
  };
  await store.putBatch({ plates: [plate], analyses: [analysis], corrections: [corrections] });
}

describe('the lab accuracy before and after learning', () => {
  it('puts plates read by the default analysis and with a learned model apart', async () => {
    const store = await openIdbStore('lab-accuracy-1');
    const experiment = kestrelExperiment();
    await store.put('experiments', experiment);
    // Worked by hand: 10 found, 2 removed and 1 added → 3 corrections over the 9 left: 1/3.
    await checkedPlate(
      store,
      experiment.id,
      10,
      [
        { op: 'remove', colonyId: 'c0' },
        { op: 'remove', colonyId: 'c1' },
        { op: 'add', colony: { ...colony(20), id: 'h1', lab: null, deltaLab: null } },
      ],
      null,
    );
    // 10 found, 1 switched → 1 correction over 10: 1/10.
    await checkedPlate(store, experiment.id, 10, [{ op: 'reclass', colonyId: 'c4', cls: 1 }], 1);
    const a = (await labAccuracy(store))!;
    expect(a.byDefault!.correctionFraction).toBeCloseTo(1 / 3, 12);
    expect(a.learned!.correctionFraction).toBeCloseTo(1 / 10, 12);
    // All together: 4 corrections over 19 colonies.
    expect(a.all.correctionFraction).toBeCloseTo(4 / 19, 12);
    expect([a.all.plates, a.byDefault!.plates, a.learned!.plates]).toEqual([2, 1, 1]);
  });
});
