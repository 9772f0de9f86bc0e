import type { Photo } from '../../schema/records.ts';
import { type PlateWorker, readPlate } from '../analysis/plate-reading.ts';
import { newPhoto } from '../bench/photos.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { demoSeed } from './demo-experiment.ts';

/**
 * Puts the demo experiment on this device: the records, the bundled plate photos (served with
 * the app, so this works offline too), and a reading of every photo, so each plate opens on its
 * colonies. Resolves to the experiment id.
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
  for (const [i, { plate }] of seed.photoPlates.entries()) {
    onStep(`Reading demo plate ${i + 1} of ${seed.photoPlates.length}…`);
    await readPlate(store, worker, experiment, plate, photos[i]!);
  }
  return experiment.id;
}

async function fetchJson(url: string): Promise<unknown> {
  const res = await fetch(url);
  if (!res.ok) throw new Error(`${url}: HTTP ${res.status}`);
  return res.json();
}
