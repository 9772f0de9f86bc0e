import type { DishRecord } from '../../schema/records.ts';
import { fetchPlatePhoto } from '../analysis/fetched-photo.ts';
import { readPlate } from '../analysis/plate-reading.ts';
import { useReading } from '../analysis/use-reading.ts';
import { go, hrefOf } from '../app/route.ts';
import { useServices } from '../app/services.ts';
import { useLive } from '../app/use-live.ts';
import { loadExperiment } from '../bench/experiment-data.ts';
import { nextPlateNeeded, type PlatePlace } from '../bench/next-plate.ts';
import { attachPhoto } from '../bench/photos.ts';
import { loadPlate } from '../bench/plate-data.ts';
import { ensureRoomFor } from '../storage/quota.ts';
import type { SyncClient } from '../sync/sync-client.ts';
import { PhotoSource } from './PhotoSource.tsx';
import { PlacePanel } from './PlacePanel.tsx';
import { ReadingStatus } from './ReadingStatus.tsx';
import { ReviewPanel } from './ReviewPanel.tsx';
import { TopBar } from './TopBar.tsx';

export function PlateScreen({ experimentId, plateId }: { experimentId: string; plateId: string }) {
  const { store, worker, sync } = useServices();
  const live = useLive((s) => loadPlate(s.store, plateId), [plateId]);
  const next = useLive(
    async (s) => {
      const all = await loadExperiment(s.store, experimentId);
      return all && nextPlateNeeded(all, plateId);
    },
    [experimentId, plateId],
  );
  const { reading, start, cancel } = useReading();
  const back = hrefOf({ screen: 'experiment', id: experimentId, tab: 'assays' });
  if (live.state !== 'ready' || !live.value)
    return (
      <>
        <TopBar title="Plate" back={back} />
        <main>
          {live.state === 'loading' ? (
            <p className="muted">Loading…</p>
          ) : (
            <p className="banner alarm">This plate is not on this device.</p>
          )}
        </main>
      </>
    );
  const d = live.value;
  const title = `${d.assay.line} g${d.assay.generation} r${d.assay.replicate} · ${d.sample.timepoint} · 1:${d.plate.dilutionFold.toLocaleString('en')}`;

  const read = (dish?: DishRecord) =>
    start(async (signal, onProgress) => {
      const fresh = await loadPlate(store, plateId);
      if (!fresh?.photo) throw new Error('the plate has no photo');
      await readPlate(store, worker, fresh.experiment, fresh.plate, fresh.photo, {
        signal,
        onProgress,
        ...(dish && { dish }),
      });
    });

  const takePhoto = (blob: Blob, name: string) =>
    start(async (signal, onProgress) => {
      await ensureRoomFor(blob.size, name);
      const { plate, photo } = await attachPhoto(store, d.plate, blob, name);
      await readPlate(store, worker, d.experiment, plate, photo, { signal, onProgress });
    });

  // The next plate of a run, photographed from this plate's check: its screen shows the reading.
  const photoForNext = (next: PlatePlace, blob: Blob, name: string) =>
    start(async (signal, onProgress) => {
      await ensureRoomFor(blob.size, name);
      const { plate, photo } = await attachPhoto(store, next.plate, blob, name);
      go({ screen: 'plate', experimentId, plateId: plate.id });
      const fresh = await loadPlate(store, plate.id);
      if (!fresh) throw new Error('the next plate is no longer on this device');
      await readPlate(store, worker, fresh.experiment, fresh.plate, photo, { signal, onProgress });
    });

  // Photographed and read on another phone: its photo waits on the lab server.
  const sharing = sync && sync.status().phase !== 'off' ? sync : null;
  const elsewhere = !d.photo && Boolean(d.plate.photoId) && sharing !== null;
  const fetchPhoto = (from: SyncClient) =>
    start(async (_signal, onProgress) => {
      onProgress('fetch', 0);
      await fetchPlatePhoto(store, worker, from, d.plate);
    });

  return (
    <>
      <TopBar title={title} back={back} />
      {d.experiment.demo && <div className="demo-banner">DEMO DATA</div>}
      <main>
        {!d.analysis && <PlacePanel assay={d.assay} sample={d.sample} plate={d.plate} />}
        <ReadingStatus reading={reading} onCancel={cancel} />
        {sharing && elsewhere && reading.state !== 'running' && (
          <section className="card stack">
            <p>This plate was photographed on another phone; its photo is on the lab server.</p>
            <button type="button" className="btn primary" onClick={() => fetchPhoto(sharing)}>
              Fetch the photo
            </button>
          </section>
        )}
        {!d.photo && !elsewhere && reading.state !== 'running' && (
          <PhotoSource onPhoto={takePhoto} />
        )}
        {d.photo && !d.analysis && reading.state !== 'running' && (
          <section className="card stack">
            <p>The photo {d.photo.name} is kept on this device but not read yet.</p>
            <button type="button" className="btn primary" onClick={() => read()}>
              Read plate
            </button>
          </section>
        )}
        {d.photo?.preview && d.analysis && (
          <ReviewPanel
            key={d.analysis.id}
            data={{ ...d, analysis: d.analysis }}
            preview={d.photo.preview as Blob}
            busy={reading.state === 'running'}
            next={next.state === 'ready' ? next.value : null}
            onReread={read}
            onNextPhoto={photoForNext}
          />
        )}
        {(d.photo || elsewhere) && reading.state !== 'running' && (
          <details className="card">
            <summary style={{ minHeight: 40 }}>Replace the photo</summary>
            <PhotoSource onPhoto={takePhoto} />
          </details>
        )}
      </main>
    </>
  );
}
