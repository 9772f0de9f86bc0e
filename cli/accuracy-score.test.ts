import { describe, expect, it } from 'vitest';
import { bestMapping, scorePlate, summarise } from './accuracy-score.ts';

const colony = (x: number, cls: string, visible = true) => ({ x, y: 100, r: 10, cls, visible });

describe('scoring a counter against labelled photos (worked by hand)', () => {
  it('matches one to one within 0.6 r, and an invisible colony counts neither way', () => {
    const truth = [colony(100, 'red'), colony(200, 'red'), colony(300, 'white', false)];
    const found = [
      { x: 103, y: 100, cls: 'A' }, // 3 px from the first: a match
      { x: 208, y: 100, cls: 'A' }, // 8 px > 0.6 × 10: no match
      { x: 301, y: 100, cls: 'B' }, // on the invisible colony: neither way
    ];
    const s = scorePlate(truth, found);
    expect([s.truePositives, s.falsePositives, s.falseNegatives]).toEqual([1, 1, 1]);
    expect(s.visible).toBe(2);
  });

  it('maps colour names once per batch, by the pairs that agree most', () => {
    const pairs: [string, string][] = [
      ['A', 'red'],
      ['A', 'red'],
      ['A', 'white'],
      ['B', 'white'],
    ];
    expect(bestMapping(pairs)).toEqual(
      new Map([
        ['A', 'red'],
        ['B', 'white'],
      ]),
    );
  });

  it('summarises F1, count error on countable plates, colour agreement and empty plates', () => {
    const truth = Array.from({ length: 40 }, (_, i) => colony(20 * i, i < 30 ? 'red' : 'white'));
    const found = truth
      .slice(0, 36)
      .map((c) => ({ x: c.x, y: c.y, cls: c.cls === 'red' ? 'A' : 'B' }));
    const empty = scorePlate([], [{ x: 5, y: 5, cls: 'A' }]);
    const s = summarise([scorePlate(truth, found), empty]);
    // 36 found of 40, plus 1 on the empty plate: P = 36/37, R = 36/40.
    expect(s.precision).toBeCloseTo(36 / 37, 12);
    expect(s.recall).toBeCloseTo(0.9, 12);
    expect(s.medianCountError).toBeCloseTo(0.1, 12);
    expect(s.colourAccuracy).toBe(1);
    expect(s.emptyPlateColonies).toBe(1);
    // red:white found 30:6 against 30:10; |ln(30.5/6.5) − ln(30.5/10.5)| = ln(10.5/6.5).
    expect(s.logRatioError).toBeCloseTo(Math.log(10.5 / 6.5), 12);
  });
});
