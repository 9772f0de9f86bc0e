import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { RECORD_KINDS } from '../../schema/kinds.ts';
import type { Analysis, Corrections, Photo } from '../../schema/records.ts';
import { openIdbStore } from '../storage/idb-store.ts';
import { newStamp } from '../storage/stamp.ts';
import { newAssay, nextAssayDraft } from './assays.ts';
import { assayRecordIds, experimentRecordIds, plateRecordIds } from './delete.ts';
import { newExperiment } from './experiments.ts';

let n = 0;
async function twoExperiments() {
  const store = await openIdbStore(`delete-${++n}`);
  const make = async (name: string) => {
    const e = newExperiment({
      name,
      lines: ['L1'],
      referenceName: 'a',
      transferDilution: 100,
      defaultDilutionFold: 1e5,
      defaultVolumeUl: 100,
    });
    const a = newAssay(e, nextAssayDraft(e, [], [], []));
    const plate = a.plates[0];
    const photo: Photo = {
      ...newStamp(),
      plateId: plate.id,
      name: 'p.jpg',
      blob: new Blob([new Uint8Array([1])]),
      preview: null,
      width: null,
      height: null,
    };
    const analysis: Analysis = {
      ...newStamp(),
      plateId: plate.id,
      photoId: photo.id,
      width: 10,
      height: 10,
      agarLab: [80, 0, 10],
      dish: null,
      colonies: [],
      classes: [
        { cls: 0, name: 'blue', hex: '#3355aa', deltaLab: [0, 0, -20] },
        { cls: 1, name: 'cream', hex: '#eeeecc', deltaLab: [2, 0, 3] },
      ],
      flags: [],
      paletteUsed: false,
      ms: 1,
      learnedFrom: null,
      candidates: null,
    };
    const corrections: Corrections = {
      ...newStamp(),
      plateId: plate.id,
      analysisId: analysis.id,
      edits: [],
      undone: [],
    };
    plate.photoId = photo.id;
    await store.putBatch({
      experiments: [e],
      assays: [a.assay],
      samples: a.samples,
      plates: a.plates,
      photos: [photo],
      analyses: [analysis],
      corrections: [corrections],
    });
    return { e, a };
  };
  return { store, keep: await make('Keep'), drop: await make('Drop') };
}

const counts = async (store: Awaited<ReturnType<typeof openIdbStore>>) =>
  Object.fromEntries(
    await Promise.all(RECORD_KINDS.map(async (k) => [k, (await store.all(k)).length])),
  );

describe('deleting', () => {
  it('an experiment takes everything of it, and nothing of another', async () => {
    const { store, drop } = await twoExperiments();
    await store.remove(await experimentRecordIds(store, drop.e.id));
    expect(await counts(store)).toEqual({
      experiments: 1,
      assays: 1,
      samples: 2,
      plates: 2,
      photos: 1,
      analyses: 1,
      corrections: 1,
    });
    expect((await store.all('experiments'))[0]!.name).toBe('Keep');
  });

  it('an assay takes its samples, plates, photo, reading and corrections', async () => {
    const { store, drop } = await twoExperiments();
    await store.remove(await assayRecordIds(store, drop.a.assay));
    expect(await counts(store)).toEqual({
      experiments: 2,
      assays: 1,
      samples: 2,
      plates: 2,
      photos: 1,
      analyses: 1,
      corrections: 1,
    });
  });

  it('a plate takes its photo, reading and corrections', async () => {
    const { store, drop } = await twoExperiments();
    await store.remove(await plateRecordIds(store, drop.a.plates[0]));
    expect(await counts(store)).toEqual({
      experiments: 2,
      assays: 2,
      samples: 4,
      plates: 3,
      photos: 1,
      analyses: 1,
      corrections: 1,
    });
  });
});
