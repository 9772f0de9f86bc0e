import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { newAssay } from '../bench/assays.ts';
import { newExperiment } from '../bench/experiments.ts';
import { openIdbStore } from '../storage/idb-store.ts';
import { newStamp } from '../storage/stamp.ts';
import { conflictPlace } from './conflict-place.ts';

describe('where a conflicted record sits', () => {
  it('names the plate of a set of corrections, the assay of a sample, and links to them', async () => {
    const store = await openIdbStore('conflict-place');
    const experiment = newExperiment({
      name: 'Marrowfield pond',
      lines: ['L4'],
      referenceName: 'MF-anc',
      transferDilution: 100,
      defaultDilutionFold: 1e5,
      defaultVolumeUl: 100,
    });
    const made = newAssay(experiment, {
      line: 'L4',
      generation: 500,
      replicate: 2,
      group: 'L4',
      testClass: 1,
      foldDilutionSinceStart: 100,
      days: 1,
      block: '',
      startDilutionFold: 1e5,
      endDilutionFold: 1e7,
      volumeUl: 100,
    });
    const plate = made.plates[1];
    const corrections = {
      ...newStamp(),
      plateId: plate.id,
      analysisId: 'a1',
      edits: [],
      undone: [],
    };
    await store.putBatch({
      experiments: [experiment],
      assays: [made.assay],
      samples: made.samples,
      plates: made.plates,
      corrections: [corrections],
    });
    expect(await conflictPlace(store, 'corrections', corrections.id)).toEqual({
      label: 'L4 g500 r2 · end · 1:10,000,000',
      href: `#/x/${experiment.id}/plate/${plate.id}`,
    });
    expect((await conflictPlace(store, 'samples', made.samples[0].id)).label).toBe(
      'L4 g500 r2 · start',
    );
    expect(await conflictPlace(store, 'experiments', experiment.id)).toEqual({
      label: 'Marrowfield pond',
      href: `#/x/${experiment.id}/assays`,
    });
    expect(await conflictPlace(store, 'plates', 'gone')).toEqual({
      label: 'not on this phone yet',
      href: null,
    });
  });
});
