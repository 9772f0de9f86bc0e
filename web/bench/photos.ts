import type { Photo, Plate } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { newStamp, revised } from '../storage/stamp.ts';

/**
 * Keeps a new photo of a plate as soon as it is taken, before any analysis, so it survives the
 * tab closing. A plate's earlier photo, its analyses and corrections go in the same transaction.
 */
export async function attachPhoto(
  store: RecordStore,
  plate: Plate,
  blob: Blob,
  name: string,
): Promise<{ plate: Plate; photo: Photo }> {
  const photo: Photo = {
    ...newStamp(),
    plateId: plate.id,
    name,
    blob,
    preview: null,
    width: null,
    height: null,
  };
  const [analyses, corrections] = await Promise.all([
    store.children('analyses', plate.id),
    store.children('corrections', plate.id),
  ]);
  const updated = revised(plate, { photoId: photo.id, typedCounts: null, reviewed: false });
  await store.putBatch(
    { photos: [photo], plates: [updated] },
    {
      photos: plate.photoId ? [plate.photoId] : [],
      analyses: analyses.map((a) => a.id),
      corrections: corrections.map((c) => c.id),
    },
  );
  return { plate: updated, photo };
}
