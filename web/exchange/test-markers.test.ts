import { describe, expect, it } from 'vitest';
import type { Experiment, PaletteRecord } from '../../schema/records.ts';
import { newExperiment } from '../bench/experiments.ts';
import { markerClasses } from './test-markers.ts';

const plain = newExperiment({
  name: 'Marrowfield reciprocal',
  lines: ['L1'],
  referenceName: 'MF-anc',
  transferDilution: 100,
  defaultDilutionFold: 1e5,
  defaultVolumeUl: 100,
});
const colour = (name: string, hex: string) => ({
  name,
  hex,
  deltaLab: [0, 0, 0] as [number, number, number],
  spread: 1,
});
const palette: PaletteRecord = {
  version: 1,
  colours: [colour('blue', '#3050a0'), colour('cream', '#f0e8d0')],
  source: 'learned',
};
// The names are the experiment's own; the learned palette only draws them.
const coloured: Experiment = {
  ...plain,
  markerColours: [
    { name: 'blue', hex: '#3f6fb0' },
    { name: 'cream', hex: '#efe6cf' },
  ],
  palette: { ...palette, colours: [colour('c1', '#3050a0'), colour('c2', '#f0e8d0')] },
};

describe('test_marker to colour class', () => {
  it('takes a marker named like one of the experiment’s colours as that colour, in any case', () => {
    const { classes, notes } = markerClasses(['Cream', 'blue', 'Cream'], coloured, 'a.csv');
    expect([...classes]).toEqual([
      ['Cream', 1],
      ['blue', 0],
    ]);
    expect(notes).toEqual([]);
  });

  it('gives other markers the remaining colours in order of appearance, and says so', () => {
    expect(markerClasses(['Ara-', 'Ara+'], coloured, 'a.csv')).toEqual({
      classes: new Map([
        ['Ara-', 1],
        ['Ara+', 0],
      ]),
      notes: ['test_marker "Ara-" was taken as cream.', 'test_marker "Ara+" was taken as blue.'],
    });
    // One matches, the other takes what is left.
    expect([...markerClasses(['Ara-', 'cream'], coloured, 'a.csv').classes]).toEqual([
      ['cream', 1],
      ['Ara-', 0],
    ]);
    expect(markerClasses([], plain, 'a.csv').classes.size).toBe(0);
  });

  it('refuses a third marker, naming the file and the values', () => {
    expect(() => markerClasses(['red', 'white', 'pink'], plain, 'counts.csv')).toThrow(
      'counts.csv: test_marker has 3 different values (red, white, pink); the plates have two colours',
    );
  });
});
