import {
  type Experiment,
  LEARNING_UNSET,
  type MarkerColour,
  UNNAMED_MARKERS,
} from '../../schema/records.ts';
import { newStamp } from '../storage/stamp.ts';

export type ExperimentDraft = Pick<
  Experiment,
  | 'name'
  | 'lines'
  | 'referenceName'
  | 'transferDilution'
  | 'defaultDilutionFold'
  | 'defaultVolumeUl'
>;

export const BLANK_EXPERIMENT: ExperimentDraft = {
  name: '',
  lines: ['L1', 'L2', 'L3'],
  referenceName: 'ancestor',
  transferDilution: 100,
  defaultDilutionFold: 100_000,
  defaultVolumeUl: 100,
};

/** A new experiment; its colours keep neutral names unless the draft names them. */
export function newExperiment(
  draft: ExperimentDraft & { markerColours?: [MarkerColour, MarkerColour] },
  demo = false,
): Experiment {
  return {
    ...newStamp(),
    markerColours: [{ ...UNNAMED_MARKERS[0] }, { ...UNNAMED_MARKERS[1] }],
    ...draft,
    demo,
    palette: null,
    learning: { ...LEARNING_UNSET },
  };
}

/** "L1, L2  L3" → ["L1", "L2", "L3"]: lines are typed as one field, split on commas or spaces. */
export function parseLines(text: string): string[] {
  return [...new Set(text.split(/[\s,;]+/).filter(Boolean))];
}
