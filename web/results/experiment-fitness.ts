import type { Analysis } from '../../fitness/analysis.ts';
import type { WorkerBridge } from '../analysis/worker-bridge.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { type FitnessInputs, fitnessInputs } from './assay-inputs.ts';
import type { FitnessWorkerApi } from './fitness-worker.ts';

export type FitnessWorker = WorkerBridge<FitnessWorkerApi>;

export type ExperimentFitness = FitnessInputs & { analysis: Analysis | null };

/** What the Fitness tab lets the person choose. */
export interface FitnessChoices {
  /** Only assays whose photo counts were all checked. */
  checkedOnly: boolean;
  /** Correct every other assay by the marker controls (fitness/analysis.ts). */
  correctMarker: boolean;
}

export const ALL_UNCORRECTED: FitnessChoices = { checkedOnly: false, correctMarker: false };

/** Every assay with counted start and end plates through the fitness engine, in its worker. */
export async function experimentFitness(
  worker: FitnessWorker,
  data: ExperimentData,
  choices: FitnessChoices,
  signal?: AbortSignal,
): Promise<ExperimentFitness> {
  const inputs = fitnessInputs(data, choices.checkedOnly);
  const analysis = await worker.call(
    (api) => api.run(inputs.inputs, { correctMarker: choices.correctMarker }),
    signal,
  );
  return { ...inputs, analysis };
}
