import { describe, expect, it } from 'vitest';
import { KINDS } from '../../schema/kinds.ts';
import { colonyAt, glareReading } from '../../tests/support/glare-reading.ts';
import { analysisRecord, plateAnalysisOf } from './records.ts';

const stamp = { id: 'a1', revision: 1, updatedAt: '2026-12-05T12:00:00.000Z' };

describe('stored colonies seen through lid glare', () => {
  it('keep that mark through the record and its check, so they teach no colours later', () => {
    const record = KINDS.analyses.check(
      analysisRecord(glareReading(), stamp, 'p1', 'f1', false),
      'r',
    );
    const back = plateAnalysisOf(record).colonies;
    expect(back.map((c) => c.glareLit === true)).toEqual([false, true]);
  });

  it('a record from before the mark was kept reads as not seen through glare', () => {
    const record = analysisRecord(glareReading([colonyAt(10, false)]), stamp, 'p1', 'f1', false);
    const older = JSON.parse(JSON.stringify(record));
    expect('glareLit' in older.colonies[0]).toBe(false);
    expect(plateAnalysisOf(KINDS.analyses.check(older, 'r')).colonies[0]!.glareLit).toBeUndefined();
  });
});
