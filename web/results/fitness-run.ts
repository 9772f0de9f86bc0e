import { type Analysis, analyse } from '../../fitness/analysis.ts';
import type { AssayInput } from '../../fitness/competition.ts';

/**
 * The fitness engine over the given assays, or null when there is none yet. The engine reports
 * an assay it cannot compute in the result's `errors`, by assay and plate; it does not throw.
 */
export function runFitness(inputs: readonly AssayInput[]): Analysis | null {
  return inputs.length === 0 ? null : analyse(inputs);
}
