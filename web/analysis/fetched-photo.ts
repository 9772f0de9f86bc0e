import type { Photo, Plate } from '../../schema/records.ts';
import { ensureRoomFor } from '../storage/quota.ts';
import type { RecordStore } from '../storage/record-store.ts';
import type { SyncClient } from '../sync/sync-client.ts';
import type { PlateWorker } from './plate-reading.ts';

/**
 * Brings the photo of a plate photographed and read on another phone from the lab server, so
 * its colonies can be reviewed and corrected here. It is kept under the id the other phone gave
 * it (the one the plate and its analysis name), with a preview made here; the plate is not read
 * again, so both phones correct the same colonies.
 */
export async function fetchPlatePhoto(
  store: RecordStore,
  worker: PlateWorker,
  sync: SyncClient,
  plate: Plate,
): Promise<Photo> {
  if (!plate.photoId) throw new Error('this plate has no photo to fetch');
  const got = await sync.fetchPhoto(plate.photoId);
  if (!got.ok) throw new Error(`the photo could not be fetched: ${got.failure.message}`);
  const name = `photo ${plate.photoId.slice(0, 8)} from the lab server`;
  await ensureRoomFor(got.value.size, name);
  const seen = await worker.call((api) => api.preview(got.value, name));
  const photo: Photo = {
    id: plate.photoId,
    revision: 1,
    updatedAt: new Date().toISOString(),
    plateId: plate.id,
    name,
    blob: got.value,
    preview: seen.preview,
    width: seen.width,
    height: seen.height,
  };
  await store.put('photos', photo);
  return photo;
}
