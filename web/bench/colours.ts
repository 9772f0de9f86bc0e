import type { ClassIndex, Experiment } from '../../schema/records.ts';

export interface ClassLook {
  name: string;
  hex: string;
}

/** Names and colours of the two classes: the experiment's palette, or neutral names until then. */
export function classLooks(experiment: Experiment): [ClassLook, ClassLook] {
  const p = experiment.palette;
  if (p)
    return [
      { name: p.colours[0].name, hex: p.colours[0].hex },
      { name: p.colours[1].name, hex: p.colours[1].hex },
    ];
  return NEUTRAL_LOOKS;
}

/** Until the colours are known: neutral names, and a blue and a cream to draw them in. */
export const NEUTRAL_LOOKS: [ClassLook, ClassLook] = [
  { name: 'colour 1', hex: '#3f6fb0' },
  { name: 'colour 2', hex: '#efe6cf' },
];

export function otherClass(c: ClassIndex): ClassIndex {
  return c === 0 ? 1 : 0;
}
