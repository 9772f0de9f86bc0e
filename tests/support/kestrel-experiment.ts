import type { Experiment, MarkerColour } from '../../schema/records.ts';
import { newExperiment } from '../../web/bench/experiments.ts';

/**
 * The invented experiment the learning tests store their plates under: one evolved line of the
 * Kestrel brook isolates against the ancestor, plated at 1e-5.
 */
export function kestrelExperiment(markerColours?: [MarkerColour, MarkerColour]): Experiment {
  return newExperiment({
    name: 'Kestrel brook isolates',
    lines: ['K1'],
    referenceName: 'KB-anc',
    transferDilution: 100,
    defaultDilutionFold: 1e5,
    defaultVolumeUl: 100,
    ...(markerColours ? { markerColours } : {}),
  });
}
