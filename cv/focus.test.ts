import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { analyzePlate } from './analyze.ts';
import { edgeWidthMm } from './focus.ts';

describe('focus', () => {
  it('gives the edge width of an ideal blurred step: C over the steepest slope', () => {
    // A unit step blurred by σ = 2 px has a steepest slope of 1 / (2·√(2π)) per px.
    const steepest = 1 / (2 * Math.sqrt(2 * Math.PI));
    expect(edgeWidthMm([{ peak: 1, steepest }], 0.1)).toBeCloseTo(0.2 * Math.sqrt(2 * Math.PI), 9);
    expect(edgeWidthMm([], 0.1)).toBeNull();
  });

  it('flags a blurred photo and not a sharp one; the measured width grows with the blur', async () => {
    const sharp = await analyzePlate(generatePlate({ seed: 3, blur: 0.8 }).image);
    const soft = await analyzePlate(generatePlate({ seed: 3, blur: 4 }).image);
    expect(sharp.flags.map((f) => f.kind)).not.toContain('out-of-focus');
    expect(soft.flags.map((f) => f.kind)).toContain('out-of-focus');
    expect(soft.edgeWidthMm!).toBeGreaterThan(sharp.edgeWidthMm! * 1.5);
  }, 30_000);
});
