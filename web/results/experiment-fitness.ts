import { type Analysis, analyse } from '../../fitness/analysis.ts';
import { FitnessError } from '../../fitness/errors.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { type FitnessInputs, fitnessInputs } from './assay-inputs.ts';

export interface ExperimentFitness extends FitnessInputs {
  analysis: Analysis | null;
  /** Why the whole analysis could not run, in the fitness engine's words. */
  error: string | null;
}

/** Runs the fitness engine over every assay with counted start and end plates. */
export function experimentFitness(data: ExperimentData): ExperimentFitness {
  const inputs = fitnessInputs(data);
  if (inputs.inputs.length === 0) return { ...inputs, analysis: null, error: null };
  try {
    return { ...inputs, analysis: analyse(inputs.inputs), error: null };
  } catch (e) {
    if (e instanceof FitnessError) return { ...inputs, analysis: null, error: e.message };
    throw e;
  }
}
