import { useEffect, useState } from 'react';
import { useServices } from '../app/services.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { type ExperimentFitness, experimentFitness } from './experiment-fitness.ts';

export type FitnessState =
  | { state: 'computing' }
  | { state: 'ready'; fit: ExperimentFitness }
  | { state: 'failed'; error: string };

/**
 * The experiment's fitness, recomputed in the worker whenever its data changes; with
 * `checkedOnly`, from the assays whose photo counts were all checked.
 */
export function useFitness(data: ExperimentData, checkedOnly: boolean): FitnessState {
  const { fitness } = useServices();
  const [state, setState] = useState<FitnessState>({ state: 'computing' });
  useEffect(() => {
    // A newer computation supersedes an older one; the older answer is dropped.
    let current = true;
    experimentFitness(fitness, data, checkedOnly).then(
      (fit) => current && setState({ state: 'ready', fit }),
      (e: unknown) =>
        current && setState({ state: 'failed', error: e instanceof Error ? e.message : String(e) }),
    );
    return () => {
      current = false;
    };
  }, [fitness, data, checkedOnly]);
  return state;
}
