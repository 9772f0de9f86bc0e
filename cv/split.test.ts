import { describe, expect, it } from 'vitest';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';
import { splitTouching } from './split.ts';

describe('splitTouching', () => {
  it('gives a pale colony its own region beside the big dark one that overshadows it', async () => {
    const { cv } = await loadOpenCv();
    const found = withMats((keep) => {
      // Buff agar; a big dark colony (radius 18) overlapping a pale one (radius 11) whose centre
      // is 22 px away, so the pale one is only a shoulder of the dark one's peak in the blob's
      // distance map; two lone colonies of the pale one's size set the plate's typical colony.
      // The foreground takes in each colony with a 2 px fringe, as a detection threshold does.
      const rgb = keep(new cv.Mat(120, 140, cv.CV_8UC3, [205, 185, 150, 0]));
      const mask = keep(cv.Mat.zeros(120, 140, cv.CV_8UC1));
      const colony = (x: number, y: number, r: number, colour: number[]) => {
        cv.circle(rgb, new cv.Point(x, y), r, [...colour, 0], -1);
        cv.circle(mask, new cv.Point(x, y), r + 2, [255, 0, 0, 0], -1);
      };
      colony(40, 60, 18, [90, 45, 45]);
      colony(62, 60, 11, [190, 175, 145]);
      colony(115, 25, 11, [90, 45, 45]);
      colony(115, 95, 11, [90, 45, 45]);
      const frame = {
        roi: { x: 0, y: 0, width: 140, height: 120 },
        scale: 1,
        width: 140,
        height: 120,
        mmPerPx: 1 / 12,
      };
      const split = splitTouching(cv, keep, rgb, mask, frame);
      const at = (x: number, y: number) => split.regions.data32S[y * 140 + x]!;
      return { dark: at(40, 60), pale: at(64, 60), count: split.regionCount };
    });
    expect(found.dark).toBeGreaterThan(0);
    expect(found.pale).toBeGreaterThan(0);
    expect(found.pale).not.toBe(found.dark);
    expect(found.count).toBe(4);
  });
});
