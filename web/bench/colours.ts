import { type ClassIndex, type Experiment, UNNAMED_MARKERS } from '../../schema/records.ts';

export interface ClassLook {
  name: string;
  hex: string;
}

/**
 * Names and colours of the two classes: always the experiment's own names (never a name made up
 * from a measured hue), drawn in the learned colours once there is a palette.
 */
export function classLooks(experiment: Experiment): [ClassLook, ClassLook] {
  const [a, b] = experiment.markerColours;
  const p = experiment.palette;
  return [
    { name: a.name, hex: p?.colours[0].hex ?? a.hex },
    { name: b.name, hex: p?.colours[1].hex ?? b.hex },
  ];
}

/** Until an experiment is at hand: neutral names, and a blue and a cream to draw them in. */
export const NEUTRAL_LOOKS: [ClassLook, ClassLook] = UNNAMED_MARKERS;

export function otherClass(c: ClassIndex): ClassIndex {
  return c === 0 ? 1 : 0;
}
