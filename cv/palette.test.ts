import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { analyzePlate } from './analyze.ts';
import { classifyWithPalette, learnPalette, paletteFromExamples } from './palette.ts';

describe('palettes', () => {
  it('taught by one colony of each colour, classify a 97:3 plate right', async () => {
    const first = await analyzePlate(generatePlate({ seed: 61, colonies: [60, 60] }).image);
    const blue = first.colonies.find((c) => first.classes[c.cls]!.name === 'blue')!;
    const cream = first.colonies.find((c) => first.classes[c.cls]!.name === 'cream')!;
    const taught = paletteFromExamples(blue, cream, ['ancestor', 'evolved']);
    expect(taught.colours.map((c) => c.name)).toEqual(['ancestor', 'evolved']);

    const skewed = await analyzePlate(generatePlate({ seed: 62, colonies: [97, 3] }).image);
    const sorted = classifyWithPalette(skewed, taught);
    expect(Math.abs(sorted.counts.ancestor! - 97)).toBeLessThanOrEqual(3);
    expect(sorted.counts.evolved).toBe(3);
    expect(sorted.classes.map((c) => c.name)).toEqual(['ancestor', 'evolved']);
  }, 60_000);

  it('learned from several plates, and none learned from plates of one colour', async () => {
    const plates = [];
    for (const seed of [63, 64])
      plates.push(await analyzePlate(generatePlate({ seed, colonies: 80 }).image));
    expect(learnPalette(plates)!.colours.map((c) => c.name)).toEqual(['blue', 'cream']);
    const oneColour = await analyzePlate(generatePlate({ seed: 65, colonies: [0, 90] }).image);
    expect(learnPalette([oneColour])).toBeNull();
  }, 60_000);

  it('re-sorting keeps image flags and recounts the colony flags', async () => {
    const a = await analyzePlate(generatePlate({ seed: 66, colonies: [0, 90] }).image);
    expect(a.flags.map((f) => f.kind)).toContain('one-colour');
    const other = await analyzePlate(generatePlate({ seed: 67, colonies: [40, 40] }).image);
    const palette = learnPalette([other])!;
    const sorted = classifyWithPalette(a, palette);
    expect(sorted.flags.map((f) => f.kind)).not.toContain('one-colour');
    expect(sorted.counts.blue ?? 0).toBeLessThanOrEqual(1);
  }, 60_000);
});
