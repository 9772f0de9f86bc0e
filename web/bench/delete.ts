import type { Assay, Plate } from '../../schema/records.ts';
import type { RecordIds, RecordStore } from '../storage/record-store.ts';

/** A plate with its photo, readings and corrections. */
export async function plateRecordIds(store: RecordStore, plate: Plate): Promise<RecordIds> {
  const [photos, analyses, corrections] = await Promise.all([
    store.children('photos', plate.id),
    store.children('analyses', plate.id),
    store.children('corrections', plate.id),
  ]);
  return {
    plates: [plate.id],
    photos: photos.map((p) => p.id),
    analyses: analyses.map((a) => a.id),
    corrections: corrections.map((c) => c.id),
  };
}

/** An assay with its samples and everything of its plates. */
export async function assayRecordIds(store: RecordStore, assay: Assay): Promise<RecordIds> {
  const [samples, plates] = await Promise.all([
    store.children('samples', assay.id),
    store.children('plates', assay.experimentId),
  ]);
  const own = plates.filter((p) => p.assayId === assay.id);
  return merged([
    { assays: [assay.id], samples: samples.map((s) => s.id) },
    ...(await Promise.all(own.map((p) => plateRecordIds(store, p)))),
  ]);
}

/** An experiment with every assay, sample, plate, photo, reading and correction of it. */
export async function experimentRecordIds(
  store: RecordStore,
  experimentId: string,
): Promise<RecordIds> {
  const assays = await store.children('assays', experimentId);
  return merged([
    { experiments: [experimentId] },
    ...(await Promise.all(assays.map((a) => assayRecordIds(store, a)))),
  ]);
}

/** Several experiments with everything of them. */
export async function experimentsRecordIds(
  store: RecordStore,
  experimentIds: readonly string[],
): Promise<RecordIds> {
  return merged(await Promise.all(experimentIds.map((id) => experimentRecordIds(store, id))));
}

function merged(parts: RecordIds[]): RecordIds {
  const out: Record<string, string[]> = {};
  for (const part of parts) {
    for (const [kind, ids] of Object.entries(part))
      out[kind] = [...(out[kind] ?? []), ...(ids ?? [])];
  }
  return out as RecordIds;
}
