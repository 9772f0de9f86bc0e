import { describe, expect, it } from 'vitest';
import type { MarkerColour } from '../../schema/records.ts';
import { fitsSwapped, pairInNamedOrder } from './class-order.ts';

const TA: [MarkerColour, MarkerColour] = [
  { name: 'red', hex: '#b3362c' },
  { name: 'white', hex: '#efe3d3' },
];

describe('the analysis colours follow the experiment names', () => {
  it('a reading whose first colour is the pale one is swapped', () => {
    expect(fitsSwapped(['#e8dccb', '#a8402f'], TA)).toBe(true);
    expect(fitsSwapped(['#a8402f', '#e8dccb'], TA)).toBe(false);
  });

  it('a learned pair is put in the names order', () => {
    const pair: [{ hex: string; k: string }, { hex: string; k: string }] = [
      { hex: '#f1e6d5', k: 'pale' },
      { hex: '#9c3327', k: 'dark' },
    ];
    expect(pairInNamedOrder(pair, TA).map((c) => c.k)).toEqual(['dark', 'pale']);
  });
});
