import { describe, expect, it } from 'vitest';
import type { ColonyRecord } from '../../schema/records.ts';
import { correctionsOf, countAccuracy } from './accuracy.ts';
import { correctedColonies } from './edits.ts';

const colony = (id: string, cls: 0 | 1, count = 1): ColonyRecord => ({
  id,
  x: 0,
  y: 0,
  r: 5,
  cls,
  confidence: 0.9,
  count,
  area: 78,
  split: false,
  lab: [50, 0, 0],
  deltaLab: [1, 1, 1],
});
const plate = (n: number, cls: 0 | 1) =>
  Array.from({ length: n }, (_, i) => colony(`${cls}-${i}`, cls));

describe('running accuracy of automatic counts against corrected ones', () => {
  it('is null before any plate is checked', () => {
    expect(countAccuracy([])).toBeNull();
  });

  it('one colony added and another removed are two corrections, not a net zero', () => {
    const found = [...plate(50, 0), ...plate(50, 1)];
    const corrected = correctedColonies(found, [
      { op: 'remove', colonyId: '0-3' },
      { op: 'add', colony: colony('h1', 0) },
    ]);
    expect(correctionsOf({ found, corrected })).toEqual({ added: 1, removed: 1, switched: 0 });
    const acc = countAccuracy([{ found, corrected }])!;
    expect(acc).toMatchObject({ plates: 1, corrections: 2, correctedTotal: 100 });
    expect(acc.correctionFraction).toBeCloseTo(0.02, 12);
    // The total was right: the median error of a plate's total hides what the corrections show.
    expect(acc.medianTotalError).toBe(0);
  });

  it('a switched clump counts for the colonies it stands for; sums run over every plate', () => {
    const found = [colony('k', 0, 4), colony('s', 1)];
    const corrected = correctedColonies(found, [{ op: 'reclass', colonyId: 'k', cls: 1 }]);
    expect(correctionsOf({ found, corrected })).toEqual({ added: 0, removed: 0, switched: 4 });
    const clean = plate(20, 1);
    const acc = countAccuracy([
      { found, corrected },
      { found: clean, corrected: clean },
    ])!;
    expect(acc.corrections).toBe(4);
    expect(acc.correctionFraction).toBeCloseTo(4 / 25, 12);
  });

  it('an empty plate found empty is no error; colonies found on an empty plate are', () => {
    expect(countAccuracy([{ found: [], corrected: [] }])!.medianTotalError).toBe(0);
    const found = plate(3, 0);
    const acc = countAccuracy([{ found, corrected: [] }])!;
    expect(acc.medianTotalError).toBe(1);
    expect(acc.correctionFraction).toBe(1);
  });
});
