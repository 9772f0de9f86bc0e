import { useEffect, useState } from 'react';
import { useServices } from '../app/services.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import {
  type ExperimentFitness,
  experimentFitness,
  type FitnessChoices,
} from './experiment-fitness.ts';

export type FitnessState =
  | { state: 'computing' }
  | { state: 'ready'; fit: ExperimentFitness }
  | { state: 'failed'; error: string };

/**
 * The experiment's fitness, recomputed in the worker whenever its data or the choices change.
 */
export function useFitness(data: ExperimentData, choices: FitnessChoices): FitnessState {
  const { checkedOnly, correctMarker } = choices;
  const { fitness } = useServices();
  const [state, setState] = useState<FitnessState>({ state: 'computing' });
  useEffect(() => {
    // A newer computation supersedes an older one; the older answer is dropped.
    let current = true;
    experimentFitness(fitness, data, { checkedOnly, correctMarker }).then(
      (fit) => current && setState({ state: 'ready', fit }),
      (e: unknown) =>
        current && setState({ state: 'failed', error: e instanceof Error ? e.message : String(e) }),
    );
    return () => {
      current = false;
    };
  }, [fitness, data, checkedOnly, correctMarker]);
  return state;
}
