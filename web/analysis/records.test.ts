import { describe, expect, it } from 'vitest';
import { KINDS } from '../../schema/kinds.ts';
import type { Colony, PlateAnalysis } from '../../worker/types.ts';
import { analysisRecord, plateAnalysisOf } from './records.ts';

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

const reading: PlateAnalysis = {
  width: 100,
  height: 100,
  scale: 1,
  dish: null,
  colonies: [colony(10, false), colony(30, true)],
  neither: [],
  counts: { red: 2 },
  classes: [{ cls: 0, name: 'red', hex: '#a03030', deltaLab: [-20, 15, 5] }],
  agarLab: [60, 15, 5],
  flags: [],
  edgeWidthMm: null,
  timings: {},
};
const stamp = { id: 'a1', revision: 1, updatedAt: '2026-12-05T12:00:00.000Z' };

describe('stored colonies seen through lid glare', () => {
  it('keep that mark through the record and its check, so they teach no colours later', () => {
    const record = KINDS.analyses.check(analysisRecord(reading, stamp, 'p1', 'f1', false), 'r');
    const back = plateAnalysisOf(record).colonies;
    expect(back.map((c) => c.glareLit === true)).toEqual([false, true]);
  });

  it('a record from before the mark was kept reads as not seen through glare', () => {
    const record = analysisRecord(
      { ...reading, colonies: [colony(10, false)] },
      stamp,
      'p1',
      'f1',
      false,
    );
    const older = JSON.parse(JSON.stringify(record));
    expect('glareLit' in older.colonies[0]).toBe(false);
    expect(plateAnalysisOf(KINDS.analyses.check(older, 'r')).colonies[0]!.glareLit).toBeUndefined();
  });
});
