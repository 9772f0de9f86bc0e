import { describe, expect, it } from 'vitest';
import { type ColourSample, classifyAside } from './classify.ts';
import { sortByLearnedColours } from './learned-colours.ts';
import type { Lab, Palette } from './types.ts';

/** `n` colonies of colour `delta` relative to a beige agar, spread by a fixed wobble. */
function colonies(delta: Lab, n: number, wobble: number): ColourSample[] {
  const agar: Lab = [80, 2, 22];
  return Array.from({ length: n }, (_, i) => {
    // Spread evenly over ±wobble (golden-ratio steps), the same on every run.
    const w = wobble * (2 * ((i * 0.618034) % 1) - 1);
    const d: Lab = [delta[0] + w, delta[1] - 0.5 * w, delta[2] + w];
    return { deltaLab: d, lab: [agar[0] + d[0], agar[1] + d[1], agar[2] + d[2]] as Lab };
  });
}

/** A plate of 40 blue-grey and 40 white colonies on beige agar. */
const twoColours = [...colonies([-30, 3, -34], 40, 3), ...colonies([6, 0, -8], 40, 1)];
const clear = twoColours.map(() => false);

/**
 * Colours learned from three checked plates of few, blurred colonies: the blue of every strength
 * (a wide spread), the white tight. Measured so on a set of phone-style photos.
 */
const wideBlue: Palette = {
  version: 1,
  colours: [
    { name: 'blue', hex: '#23537f', deltaLab: [-25.7, -0.7, -29.5], spread: 10.5 },
    { name: 'white', hex: '#a8afbb', deltaLab: [11.2, 0.2, -6.9], spread: 2.1 },
  ],
};
/** The same two colours learned from a whole batch. */
const batchBlue: Palette = {
  version: 1,
  colours: [
    { name: 'blue', hex: '#2b5a8c', deltaLab: [-27, 6, -34], spread: 5.4 },
    { name: 'white', hex: '#b0b4bc', deltaLab: [8, 1, -7], spread: 2.5 },
  ],
};

describe('sortByLearnedColours', () => {
  it("sorts by the plate's own two colours, flagged, where the learned colours sort them otherwise", () => {
    // The wide blue takes 28 of the 40 whites: the mistake this is for.
    const byModel = classifyAside(twoColours, clear, wideBlue);
    expect(byModel.cls.filter((k) => k === 0).length).toBe(68);
    const { classes, flag } = sortByLearnedColours(twoColours, clear, wideBlue);
    expect(flag).toEqual({ kind: 'learned-recolours', recoloured: 28, colonies: 80 });
    // Sorted by the plate's own colours, named as the lab named them.
    expect(classes.classes.map((c) => c.name)).toEqual(['blue', 'white']);
    expect(classes.cls.slice(0, 40).every((k) => k === 0)).toBe(true);
    expect(classes.cls.slice(40).every((k) => k === 1)).toBe(true);
  });

  it('keeps the learned sorting, unflagged, where it sorts the plate as its own colours do', () => {
    const { classes, flag } = sortByLearnedColours(twoColours, clear, batchBlue);
    expect(flag).toBeNull();
    expect(classes).toEqual(classifyAside(twoColours, clear, batchBlue));
  });

  it('keeps the learned sorting on a plate of one colour of its own, whatever its shades', () => {
    const blues = colonies([-22, 2, -26], 60, 6);
    const none = blues.map(() => false);
    const { classes, flag } = sortByLearnedColours(blues, none, wideBlue);
    expect(flag).toBeNull();
    expect(classes).toEqual(classifyAside(blues, none, wideBlue));
  });
});
