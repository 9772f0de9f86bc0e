import { type Analysis, analyse } from '../../fitness/analysis.ts';
import type { AssayInput } from '../../fitness/competition.ts';

/**
 * The fitness engine over the given assays, or null when there is none yet. The engine reports
 * an assay it cannot compute in the result's `errors`, by assay and plate. With `correctMarker`
 * the assays are corrected by the marker controls (group `marker-control`); with none computed,
 * it throws a FitnessError saying so.
 */
export function runFitness(
  inputs: readonly AssayInput[],
  options: { correctMarker: boolean } = { correctMarker: false },
): Analysis | null {
  return inputs.length === 0 ? null : analyse(inputs, { correctMarker: options.correctMarker });
}
