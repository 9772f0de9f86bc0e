import { describe, expect, it } from 'vitest';
import { parseFold } from './fold-text.ts';

describe('parseFold: dilutions as written at the bench', () => {
  it.each([
    ['100000', 1e5],
    ['1e5', 1e5],
    ['10^5', 1e5],
    ['10^-5', 1e5],
    ['1:100000', 1e5],
    ['10-5', 1e5],
    [' 250 ', 250],
    ['0,5', 0.5],
    ['105', 105],
  ])('%s → %d', (text, value) => {
    expect(parseFold(text)).toBe(value);
  });

  it.each(['', 'abc', '0', '-3', '1:0', 'Infinity'])('%j is not a dilution', (text) => {
    expect(parseFold(text)).toBeNull();
  });

  it('whole numbers for counts: 0 allowed, fractions not', () => {
    expect(parseFold('0', true)).toBe(0);
    expect(parseFold('12', true)).toBe(12);
    expect(parseFold('12.5', true)).toBeNull();
    expect(parseFold('-1', true)).toBeNull();
  });
});
