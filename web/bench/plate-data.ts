import type {
  Analysis,
  Assay,
  Corrections,
  Experiment,
  Photo,
  Plate,
  Sample,
} from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';

export interface PlateData {
  experiment: Experiment;
  assay: Assay;
  sample: Sample;
  plate: Plate;
  photo: Photo | null;
  analysis: Analysis | null;
  corrections: Corrections | null;
}

export async function loadPlate(store: RecordStore, plateId: string): Promise<PlateData | null> {
  const plate = await store.get('plates', plateId);
  if (!plate) return null;
  const [experiment, assay, sample, photo, analyses, corrections] = await Promise.all([
    store.get('experiments', plate.experimentId),
    store.get('assays', plate.assayId),
    store.get('samples', plate.sampleId),
    plate.photoId ? store.get('photos', plate.photoId) : undefined,
    store.children('analyses', plate.id),
    store.children('corrections', plate.id),
  ]);
  if (!experiment || !assay || !sample) return null;
  const analysis = analyses.sort((a, b) => a.updatedAt.localeCompare(b.updatedAt)).at(-1) ?? null;
  return {
    experiment,
    assay,
    sample,
    plate,
    photo: photo ?? null,
    analysis,
    corrections: corrections.find((c) => c.analysisId === analysis?.id) ?? null,
  };
}
