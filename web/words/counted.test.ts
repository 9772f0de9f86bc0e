import { describe, expect, it } from 'vitest';
import { counted } from './counted.ts';

describe('grammar of counts', () => {
  it('counts agree with their noun', () => {
    expect(counted(1, 'checked plate', 'checked plates')).toBe('1 checked plate');
    expect(counted(0, 'clump', 'clumps')).toBe('0 clumps');
    expect(counted(1200, 'colony', 'colonies')).toBe('1,200 colonies');
  });
});
