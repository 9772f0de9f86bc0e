import { describe, expect, it } from 'vitest';
import { openWithDisc } from './disc-opening.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

describe('opening by a disc', () => {
  // Reference: the opening of a set by a disc is the union of the discs that fit inside it
  // (Serra 1982, "Image analysis and mathematical morphology", ch. 2, cited from memory). So a
  // band narrower than the disc vanishes, a band wider than it is kept whole, and so is a larger
  // disc.
  it('keeps what holds the disc and removes what does not', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const size = 120;
      const mask = keep(new cv.Mat(size, size, cv.CV_8UC1, [0, 0, 0, 0]));
      const m = mask.data;
      const set = (x: number, y: number) => {
        m[y * size + x] = 255;
      };
      for (let y = 10; y < 16; y++) for (let x = 5; x < 115; x++) set(x, y); // 6 px band
      for (let y = 30; y < 46; y++) for (let x = 5; x < 115; x++) set(x, y); // 16 px band
      for (let y = 60; y < 110; y++)
        for (let x = 30; x < 90; x++) if ((x - 60) ** 2 + (y - 85) ** 2 <= 12 ** 2) set(x, y);
      const opened = keep(new cv.Mat());
      openWithDisc(cv, mask, opened, 5);
      const count = (y0: number, y1: number) => {
        let n = 0;
        for (let i = y0 * size; i < y1 * size; i++) if (opened.data[i]) n++;
        return n;
      };
      expect(count(0, 20)).toBe(0);
      // The wide band loses only the corners the disc cannot reach at its two ends.
      expect(count(25, 50)).toBeGreaterThan(0.97 * 110 * 16);
      const disc = count(55, 120);
      expect(disc).toBeGreaterThan(0.95 * Math.PI * 12 ** 2);
      expect(disc).toBeLessThanOrEqual(Math.PI * 12.5 ** 2);
    });
  });
});
