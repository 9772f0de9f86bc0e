/**
 * The fitness engine in a worker of its own: a large experiment's bootstrap intervals and model
 * fits take a few hundred milliseconds, which would freeze the screen on the main thread.
 * Inputs and results are plain data, copied both ways.
 */
import { expose } from 'comlink';
import { runFitness } from './fitness-run.ts';

const api = { run: runFitness };

export type FitnessWorkerApi = typeof api;

expose(api);
