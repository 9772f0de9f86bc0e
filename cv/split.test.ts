import { describe, expect, it } from 'vitest';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';
import { typicalPeak } from './split.ts';

describe('typical colony radius', () => {
  // Reference: the Euclidean distance transform of a filled disc of radius r peaks at its centre
  // at about r, here 9–10 px for a disc drawn with radius 9 (the distance to the nearest background pixel; Borgefors 1986 for the 5×5 mask's
  // error, under 2 %, cited from memory).
  it('is the colonies’ radius, however many specks thinner than a colony there are', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const mask = keep(cv.Mat.zeros(200, 200, cv.CV_8UC1));
      for (const x of [40, 100, 160]) cv.circle(mask, new cv.Point(x, 40), 9, [255, 0, 0, 0], -1);
      // Twelve specks 3 px across: more than the colonies, so they would set the median.
      for (let i = 0; i < 12; i++)
        cv.circle(mask, new cv.Point(20 + 14 * i, 150), 1, [255, 0, 0, 0], -1);
      const distance = keep(new cv.Mat());
      cv.distanceTransform(mask, distance, cv.DIST_L2, cv.DIST_MASK_5);
      const labels = keep(new cv.Mat());
      const n = cv.connectedComponents(mask, labels, 8, cv.CV_32S) - 1;
      expect(n).toBe(15);
      // The smallest colony counted here: radius 4 px.
      const typical = typicalPeak(distance, labels, n, 4);
      expect(typical).toBeGreaterThan(8.5);
      expect(typical).toBeLessThan(10.5);
      // Every blob voting, the specks outvote the colonies.
      expect(typicalPeak(distance, labels, n, 1)).toBeLessThan(3);
    });
  });
});
