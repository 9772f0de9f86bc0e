import { describe, expect, it } from 'vitest';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

describe('loadOpenCv', () => {
  it('starts the shipped opencv.js once and hands out the same runtime', async () => {
    const a = await loadOpenCv();
    const b = await loadOpenCv();
    expect(a.cv).toBe(b.cv);
    expect(typeof a.cv.watershed).toBe('function');
  });
});

describe('withMats', () => {
  it('frees every kept Mat on success and on error', async () => {
    const { cv } = await loadOpenCv();
    const made: { isDeleted(): boolean }[] = [];
    const n = withMats((keep) => {
      const m = keep(new cv.Mat(10, 10, cv.CV_8UC1, [7, 0, 0, 0]));
      made.push(m);
      return cv.countNonZero(m);
    });
    expect(n).toBe(100);
    expect(() =>
      withMats((keep) => {
        made.push(keep(new cv.Mat(4, 4, cv.CV_8UC1)));
        throw new Error('boom');
      }),
    ).toThrow('boom');
    expect(made.every((m) => m.isDeleted())).toBe(true);
  });
});
