import { describe, expect, it } from 'vitest';
import { studentizedRangeQuantile, studentizedRangeUpperP } from './studentized-range.ts';

// Reference values computed once with R 4.2.2 (Debian r-base-core):
//   ptukey(q, nmeans = k, df = df, lower.tail = FALSE) and qtukey(0.95, nmeans = k, df = df).
const UPPER: [number, number, number, number][] = [
  [3.5, 3, 12, 0.069995485275448743],
  [2.1, 2, 5, 0.1976933730927678],
  [4.2, 5, 20, 0.052353576678205838],
  [1, 4, 8, 0.89153088027738336],
  [6, 3, 30, 0.00055749003853322598],
  [0.5, 6, 3, 0.99841035930800714],
  [3, 10, 150, 0.51561022703285342],
  [5.5, 4, 2, 0.1452102631665696],
];
const Q95: [number, number, number][] = [
  [3, 12, 3.7729289594083459],
  [2, 5, 3.6353514212908076],
  [5, 20, 4.2318566829303634],
  [10, 150, 4.5423463495951024],
];

describe('studentized range distribution', () => {
  it.each(UPPER)('P(Q ≥ %d | k = %d, df = %d) as R ptukey', (q, k, df, p) => {
    expect(Math.abs(studentizedRangeUpperP(q, k, df) - p)).toBeLessThan(1e-9);
  });

  it.each(Q95)('95 %% quantile for k = %d, df = %d as R qtukey', (k, df, q) => {
    expect(studentizedRangeQuantile(0.95, k, df)).toBeCloseTo(q, 6);
  });

  it('refuses arguments with no answer instead of giving NaN', () => {
    expect(() => studentizedRangeUpperP(2, 1, 10)).toThrow(RangeError);
    expect(() => studentizedRangeUpperP(2, 3, 1)).toThrow(RangeError);
    expect(() => studentizedRangeUpperP(Number.NaN, 3, 10)).toThrow(RangeError);
  });
});
