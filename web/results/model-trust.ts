import type { LineTrajectory } from '../../fitness/analysis.ts';
import type { CurveFit, ModelFailure } from '../../fitness/trajectories.ts';

/** Fewer distinct generations than this, and no model of the trajectory is shown as a result. */
export const MIN_GENERATIONS = 3;

/** The models' names as people read them, the same in the table, the text and the plot. */
export const MODEL_NAMES: Record<string, string> = {
  hyperbolic: 'hyperbolic',
  'power-law': 'power law',
  step: 'step',
};

export function distinctGenerations(t: LineTrajectory): number {
  return new Set(t.points.map((p) => p.generation)).size;
}

/**
 * Why a model of a line must not be read as a result, or null when it may: too few generations
 * to tell curves apart, a fit that failed, or a parameter whose SE exceeds its estimate.
 */
export function modelDoubt(
  t: LineTrajectory,
  fit: CurveFit | ModelFailure | LineTrajectory['step'],
): string | null {
  const n = distinctGenerations(t);
  if (n < MIN_GENERATIONS)
    return `measured at ${n === 1 ? 'one generation' : `${n} generations`}; a model needs ${MIN_GENERATIONS}`;
  if ('reason' in fit) return `not fitted: ${fit.reason}`;
  if ('parameters' in fit && fit.parameters.some((p) => p.poorlyDetermined))
    return 'a parameter is poorly determined (its SE exceeds its value)';
  return null;
}

/** A line's model by the name the ranking gives it. */
export function modelNamed(t: LineTrajectory, model: string) {
  return model === 'hyperbolic' ? t.hyperbolic : model === 'power-law' ? t.powerLaw : t.step;
}

/** "generations 500–1000", or "generation 500" when a span is one generation. */
export function generationSpan(from: number, to: number): string {
  return from === to ? `generation ${from}` : `generations ${from}–${to}`;
}
