import type {
  Analysis,
  Assay,
  Corrections,
  Experiment,
  Plate,
  Sample,
} from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';

/** Everything of one experiment the screens show, except photo pixels (loaded per plate). */
export interface ExperimentData {
  experiment: Experiment;
  assays: Assay[];
  samples: Sample[];
  plates: Plate[];
  analyses: Map<string, Analysis>;
  corrections: Map<string, Corrections>;
}

export async function loadExperiment(
  store: RecordStore,
  id: string,
): Promise<ExperimentData | null> {
  const experiment = await store.get('experiments', id);
  if (!experiment) return null;
  const [assays, plates] = await Promise.all([
    store.children('assays', id),
    store.children('plates', id),
  ]);
  const samples = (await Promise.all(assays.map((a) => store.children('samples', a.id)))).flat();
  const analyses = new Map<string, Analysis>();
  const corrections = new Map<string, Corrections>();
  await Promise.all(
    plates.map(async (p) => {
      const [a, c] = await Promise.all([
        store.children('analyses', p.id),
        store.children('corrections', p.id),
      ]);
      const latest = a.sort((x, y) => x.updatedAt.localeCompare(y.updatedAt)).at(-1);
      if (latest) analyses.set(p.id, latest);
      const corr = c.find((x) => x.analysisId === latest?.id);
      if (corr) corrections.set(p.id, corr);
    }),
  );
  assays.sort(
    (a, b) =>
      a.line.localeCompare(b.line) || a.generation - b.generation || a.replicate - b.replicate,
  );
  return { experiment, assays, samples, plates, analyses, corrections };
}
