import { describe, expect, it } from 'vitest';
import { countAccuracy } from './accuracy.ts';

describe('running accuracy of automatic counts against corrected ones', () => {
  it('is null before any plate is reviewed', () => {
    expect(countAccuracy([])).toBeNull();
  });

  it('sums class differences over the corrected total, and takes the median total error', () => {
    const acc = countAccuracy([
      { found: [100, 50], corrected: [100, 50] }, // perfect
      { found: [98, 52], corrected: [100, 50] }, // two switched: total right, classes off by 2+2
      { found: [40, 0], corrected: [45, 5] }, // 10 missed
    ]);
    expect(acc).toMatchObject({ plates: 3, countDifference: 14, correctedTotal: 350 });
    expect(acc!.countErrorFraction).toBeCloseTo(14 / 350, 12);
    // Total errors per plate: 0, 0, 10/50 → median 0.
    expect(acc!.medianTotalError).toBe(0);
  });

  it('an empty plate found empty is no error; colonies found on an empty plate are', () => {
    expect(countAccuracy([{ found: [0, 0], corrected: [0, 0] }])!.medianTotalError).toBe(0);
    expect(countAccuracy([{ found: [3, 0], corrected: [0, 0] }])!.medianTotalError).toBe(1);
  });
});
