import { proxy } from 'comlink';
import type { Analysis, DishRecord, Experiment, Photo, Plate } from '../../schema/records.ts';
import type { PlateWorkerApi } from '../../worker/plate-worker.ts';
import type { Palette } from '../../worker/types.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { newStamp, revised } from '../storage/stamp.ts';
import { inNamedOrder } from './class-order.ts';
import { modelForReading } from './learning.ts';
import { analysisRecord, paletteOf, plateAnalysisOf } from './records.ts';
import type { WorkerBridge } from './worker-bridge.ts';

export type PlateWorker = WorkerBridge<PlateWorkerApi>;

export interface ReadOptions {
  /** A dish placed by the person (original pixels); otherwise the analysis finds it. */
  dish?: DishRecord;
  signal?: AbortSignal;
  onProgress?: (stage: string, fraction: number) => void;
}

/**
 * Reads one plate photo in the worker and stores the result: the preview on the photo, a new
 * analysis replacing the plate's earlier ones, and no corrections (they belonged to the old
 * colonies). Without a palette, the reading's two colours are put in the order of the
 * experiment's names. The palette itself is learned from checked plates only (teach.ts), never
 * from a reading nobody has looked at. While the experiment learns, the plate is read with its
 * model (learning.ts); a model that cannot be read leaves the default analysis to read it.
 */
export async function readPlate(
  store: RecordStore,
  worker: PlateWorker,
  experiment: Experiment,
  plate: Plate,
  photo: Photo,
  options: ReadOptions = {},
): Promise<Analysis> {
  const palette = experiment.palette ? paletteOf(experiment.palette) : undefined;
  const { model } = modelForReading(experiment);
  const onProgress = options.onProgress && proxy(options.onProgress);
  const result = await worker.call(
    (api) =>
      api.analyse(
        {
          photo: photo.blob as Blob,
          name: photo.name,
          ...(palette && { palette }),
          ...(options.dish && { dish: options.dish }),
          ...(model && { model }),
        },
        onProgress,
      ),
    options.signal,
  );
  // A model's own colours are named as the experiment names them, in that order.
  const sorted = Boolean(palette ?? model?.palette);
  const read = analysisRecord(result.analysis, newStamp(), plate.id, photo.id, sorted);
  const analysis = sorted ? read : inNamedOrder(read, experiment.markerColours);
  const [old, oldCorrections] = await Promise.all([
    store.children('analyses', plate.id),
    store.children('corrections', plate.id),
  ]);
  await store.putBatch({
    photos: [
      revised(photo, {
        preview: result.preview,
        width: result.analysis.width,
        height: result.analysis.height,
      }),
    ],
    analyses: [analysis],
    plates: [revised(plate, { reviewed: false })],
  });
  // The old reading goes only once the new one is stored: a crash in between leaves an extra
  // analysis (the newest is the one shown), never a plate without one.
  await store.remove({
    analyses: old.map((a) => a.id),
    corrections: oldCorrections.map((c) => c.id),
  });
  return analysis;
}

/**
 * Re-sorts every analysed plate of an experiment into the palette's two colours without finding
 * the colonies again. Colony ids stay, so the person's corrections still apply.
 */
export async function reclassifyAll(
  store: RecordStore,
  worker: PlateWorker,
  palette: Palette,
  analyses: readonly Analysis[],
): Promise<void> {
  const updated: Analysis[] = [];
  for (const a of analyses) {
    const measured = a.colonies.filter((c) => c.lab && c.deltaLab);
    const out = await worker.call((api) => api.reclassify(plateAnalysisOf(a), palette));
    const cls = new Map(measured.map((c, i) => [c.id, out.colonies[i]?.cls ?? c.cls]));
    const conf = new Map(
      measured.map((c, i) => [c.id, out.colonies[i]?.confidence ?? c.confidence]),
    );
    const classes = analysisRecord(out, a, a.plateId, a.photoId, true).classes;
    updated.push(
      revised(a, {
        colonies: a.colonies.map((c) => ({
          ...c,
          cls: cls.get(c.id) ?? c.cls,
          confidence: conf.get(c.id) ?? c.confidence,
        })),
        classes,
        paletteUsed: true,
      }),
    );
  }
  await store.putBatch({ analyses: updated });
}
