import { describe, expect, it } from 'vitest';
import { counted, plateFlagLabel, resultFlagLabel } from './flag-words.ts';

describe('flag codes in words', () => {
  it('every known code has words; an unknown one loses its dashes', () => {
    expect(plateFlagLabel('clumps-estimated')).toBe('clumps estimated');
    expect(plateFlagLabel('low-confidence')).toBe('unsure colours');
    expect(resultFlagLabel('out-of-range')).toBe('plate outside the countable range');
    expect(plateFlagLabel('new-kind-of-remark')).toBe('new kind of remark');
  });

  it('counts agree with their noun', () => {
    expect(counted(1, 'checked plate', 'checked plates')).toBe('1 checked plate');
    expect(counted(0, 'clump', 'clumps')).toBe('0 clumps');
    expect(counted(1200, 'colony', 'colonies')).toBe('1,200 colonies');
  });
});
