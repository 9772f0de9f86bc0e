import { describe, expect, it } from 'vitest';
import {
  COUNTABLE_RANGES,
  type CountableRange,
  countableStatus,
  DEFAULT_COUNTABLE_RANGE,
} from './countable-range.ts';

describe('COUNTABLE_RANGES', () => {
  it('carries the published ranges', () => {
    // FDA BAM ch. 3, Aerobic Plate Count: 25–250 CFU per plate.
    expect(COUNTABLE_RANGES.bam).toMatchObject({ min: 25, max: 250 });
    // Standard Methods 9215 (heterotrophic plate count): 30–300, from memory.
    expect(COUNTABLE_RANGES.sm9215).toMatchObject({ min: 30, max: 300 });
    // ISO 7218:2007, 90 mm dishes: 10–300.
    expect(COUNTABLE_RANGES.iso7218).toMatchObject({ min: 10, max: 300 });
    expect(DEFAULT_COUNTABLE_RANGE).toBe(COUNTABLE_RANGES.bam);
    for (const r of Object.values(COUNTABLE_RANGES)) expect(r.source).toMatch(/\d+–\d+/);
  });
});

describe('countableStatus', () => {
  it('is inclusive at both ends of the default BAM range', () => {
    expect(countableStatus(24)).toBe('too-few');
    expect(countableStatus(25)).toBe('countable');
    expect(countableStatus(250)).toBe('countable');
    expect(countableStatus(251)).toBe('too-many');
    expect(countableStatus(0)).toBe('too-few');
  });

  it('follows the range it is given', () => {
    expect(countableStatus(12, COUNTABLE_RANGES.iso7218)).toBe('countable');
    expect(countableStatus(9, COUNTABLE_RANGES.iso7218)).toBe('too-few');
    expect(countableStatus(280, COUNTABLE_RANGES.sm9215)).toBe('countable');
    expect(countableStatus(301, COUNTABLE_RANGES.sm9215)).toBe('too-many');
  });

  it('rejects impossible totals and ranges', () => {
    expect(() => countableStatus(-1)).toThrow(RangeError);
    expect(() => countableStatus(2.5)).toThrow(RangeError);
    expect(() => countableStatus(Number.NaN)).toThrow(RangeError);
    const bad: CountableRange = { min: 300, max: 30, source: 'typo' };
    expect(() => countableStatus(100, bad)).toThrow(/typo/);
  });
});
