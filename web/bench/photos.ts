import type { Photo, Plate } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { newStamp, revised } from '../storage/stamp.ts';

/** A new photo record of a plate, not yet read (no preview, size unknown). */
export function newPhoto(plate: Plate, blob: Blob, name: string): Photo {
  return { ...newStamp(), plateId: plate.id, name, blob, preview: null, width: null, height: null };
}

/**
 * Keeps a new photo of a plate as soon as it is taken, before any analysis, so it survives the
 * tab closing. The plate's earlier photo, its analyses and corrections are then deleted.
 */
export async function attachPhoto(
  store: RecordStore,
  plate: Plate,
  blob: Blob,
  name: string,
): Promise<{ plate: Plate; photo: Photo }> {
  const photo = newPhoto(plate, blob, name);
  const [analyses, corrections] = await Promise.all([
    store.children('analyses', plate.id),
    store.children('corrections', plate.id),
  ]);
  const updated = revised(plate, { photoId: photo.id, typedCounts: null, reviewed: false });
  await store.putBatch({ photos: [photo], plates: [updated] });
  // The earlier photo and its readings go once the new one is stored: a crash in between
  // leaves them orphaned, never the plate pointing at nothing.
  await store.remove({
    photos: plate.photoId ? [plate.photoId] : [],
    analyses: analyses.map((a) => a.id),
    corrections: corrections.map((c) => c.id),
  });
  return { plate: updated, photo };
}
