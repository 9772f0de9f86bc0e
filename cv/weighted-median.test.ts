import { describe, expect, it } from 'vitest';
import { weightedMedian } from './weighted-median.ts';

const equal = (...values: number[]) => values.map((value) => ({ value, weight: 1 }));

// The median of an odd count is the middle value, of an even count the mean of the two middle
// ones (the textbook definition, common practice); weights count as repeated items.
describe('weightedMedian', () => {
  it('is the middle value, or the mean of the two middle values', () => {
    expect(weightedMedian(equal(3, 1, 2))).toBe(2);
    expect(weightedMedian(equal(4, 1, 3, 2))).toBe(2.5);
    expect(weightedMedian(equal(1.75, 4.5))).toBe(3.125);
  });

  it('counts a weight as that many items', () => {
    const weighted = [
      { value: 1, weight: 3 },
      { value: 10, weight: 1 },
    ];
    expect(weightedMedian(weighted)).toBe(weightedMedian(equal(1, 1, 1, 10)));
    expect(weightedMedian(weighted)).toBe(1);
  });

  it('is not moved by one far value, as a mean is', () => {
    expect(weightedMedian(equal(2, 2.5, 3, 100))).toBe(2.75);
  });
});
