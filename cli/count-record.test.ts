import { describe, expect, it } from 'vitest';
import type { Colony, PlateAnalysis } from '../cv/index.ts';
import { DEFAULT_COUNTABLE_RANGE } from '../fitness/countable-range.ts';
import { countRecord } from './count-record.ts';

const colony = (x: number, glareLit: boolean): Colony => ({
  x,
  y: 10,
  r: 4,
  area: 50,
  cls: 0,
  confidence: 1,
  split: false,
  count: 1,
  lab: [40, 30, 10],
  deltaLab: [-20, 15, 5],
  ...(glareLit ? { glareLit: true as const } : {}),
});

describe('a count record', () => {
  it('marks the colonies seen through lid glare, and only those', () => {
    const a: PlateAnalysis = {
      width: 100,
      height: 100,
      scale: 1,
      dish: null,
      colonies: [colony(10, false), colony(30, true)],
      neither: [],
      counts: { red: 2 },
      classes: [{ cls: 0, name: 'red', hex: '#a03030', deltaLab: [-20, 15, 5] }],
      agarLab: [60, 15, 5],
      flags: [{ kind: 'glare', fraction: 0.1 }],
      edgeWidthMm: null,
      timings: {},
    };
    const r = JSON.parse(JSON.stringify(countRecord('p.jpg', a, 5, DEFAULT_COUNTABLE_RANGE)));
    expect(r.colonies.map((c: { glareLit?: boolean }) => c.glareLit ?? false)).toEqual([
      false,
      true,
    ]);
  });
});
