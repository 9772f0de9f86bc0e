import type { Analysis } from '../../fitness/analysis.ts';
import type { WorkerBridge } from '../analysis/worker-bridge.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { type FitnessInputs, fitnessInputs } from './assay-inputs.ts';
import type { FitnessWorkerApi } from './fitness-worker.ts';

export type FitnessWorker = WorkerBridge<FitnessWorkerApi>;

export type ExperimentFitness = FitnessInputs & { analysis: Analysis | null };

/** Every assay with counted start and end plates through the fitness engine, in its worker. */
export async function experimentFitness(
  worker: FitnessWorker,
  data: ExperimentData,
  checkedOnly: boolean,
  signal?: AbortSignal,
): Promise<ExperimentFitness> {
  const inputs = fitnessInputs(data, checkedOnly);
  const analysis = await worker.call((api) => api.run(inputs.inputs), signal);
  return { ...inputs, analysis };
}
