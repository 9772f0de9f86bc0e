import { describe, expect, it } from 'vitest';
import { DEFAULT_COUNTABLE_RANGE } from '../fitness/countable-range.ts';
import { glareReading } from '../tests/support/glare-reading.ts';
import { countRecord } from './count-record.ts';

describe('a count record', () => {
  it('marks the colonies seen through lid glare, and only those', () => {
    const r = JSON.parse(
      JSON.stringify(countRecord('p.jpg', glareReading(), 5, DEFAULT_COUNTABLE_RANGE)),
    );
    expect(r.colonies.map((c: { glareLit?: boolean }) => c.glareLit ?? false)).toEqual([
      false,
      true,
    ]);
  });
});
