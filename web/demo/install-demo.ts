import type { Assay, Photo } from '../../schema/records.ts';
import { type PlateWorker, readPlate } from '../analysis/plate-reading.ts';
import { newPhoto } from '../bench/photos.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';
import { demoSeed } from './demo-experiment.ts';

/**
 * Puts the demo experiment on this device: the records, the bundled plate photos (served with
 * the app, so this works offline too), and a first reading of one photo, from which the palette
 * is learned. Resolves to the experiment id.
 */
export async function installDemo(
  store: RecordStore,
  worker: PlateWorker,
  onStep: (text: string) => void,
): Promise<string> {
  onStep('Fetching the demo plates…');
  const names = (await fetchJson('demo/index.json')) as string[];
  const seed = demoSeed(names);
  const photos: Photo[] = [];
  for (const { name, plate } of seed.photoPlates) {
    const res = await fetch(`demo/${encodeURIComponent(name)}`);
    if (!res.ok) throw new Error(`demo plate ${name}: HTTP ${res.status}`);
    const blob = await res.blob();
    const photo = newPhoto(plate, blob, name);
    plate.photoId = photo.id;
    photos.push(photo);
  }
  await store.putBatch({ ...seed.batch, photos });
  const experiment = seed.batch.experiments![0]!;
  const first = seed.photoPlates[0];
  if (first && photos[0]) {
    onStep('Reading the first demo plate…');
    await readPlate(store, worker, experiment, first.plate, photos[0]);
    const learned = await store.get('experiments', experiment.id);
    const palette = learned?.palette;
    if (palette) {
      // The evolved lines grow cream-white, the ancestor blue: the test colour is the less blue
      // one (higher b* relative to the agar).
      const testClass = palette.colours[0].deltaLab[2] > palette.colours[1].deltaLab[2] ? 0 : 1;
      const assays: Assay[] = seed.assays.map((a) => revised(a.assay, { testClass }));
      await store.putBatch({ assays });
    }
  }
  return experiment.id;
}

async function fetchJson(url: string): Promise<unknown> {
  const res = await fetch(url);
  if (!res.ok) throw new Error(`${url}: HTTP ${res.status}`);
  return res.json();
}
