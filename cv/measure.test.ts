import { describe, expect, it } from 'vitest';
import { withMats } from './mat-scope.ts';
import { measureRegions } from './measure.ts';
import { loadOpenCv } from './opencv.ts';

describe('regions that meet', () => {
  // Two regions meet where the watershed's line separates them (Beucher & Meyer 1993): the line's
  // pixels are unlabelled, so a line pixel with two labels among its 8 neighbours joins them
  // (8-adjacency, Rosenfeld's digital topology; cited from memory). Four quadrants cut by a "+" of
  // lines all meet at its centre, diagonally too.
  it('counts the regions each one meets across a watershed line, and none across background', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const size = 31;
      const regions = keep(cv.Mat.zeros(size, size, cv.CV_32S));
      const components = keep(cv.Mat.zeros(size, size, cv.CV_32S));
      const l = regions.data32S;
      const c = components.data32S;
      for (let y = 1; y < 20; y++) {
        for (let x = 1; x < 20; x++) {
          c[y * size + x] = 1;
          if (x === 10 || y === 10) continue;
          l[y * size + x] = (y < 10 ? 1 : 3) + (x < 10 ? 0 : 1);
        }
      }
      // A fifth region, its own blob, beside quadrant 2 across background (component 0).
      for (let y = 1; y < 9; y++) {
        for (let x = 22; x < 29; x++) {
          c[y * size + x] = 2;
          l[y * size + x] = 5;
        }
      }
      // Background flooded into blob 1 next to quadrant 4: unlabelled foreground that one region touches.
      for (let y = 20; y < 23; y++) for (let x = 12; x < 18; x++) c[y * size + x] = 1;
      const plane = (type: number) => keep(cv.Mat.zeros(size, size, type));
      const measured = measureRegions(
        regions,
        5,
        components,
        2,
        plane(cv.CV_32F),
        plane(cv.CV_8UC3),
        plane(cv.CV_8UC3),
        plane(cv.CV_32F),
        plane(cv.CV_32F),
        plane(cv.CV_8UC1),
        plane(cv.CV_8UC1),
      );
      const meets = Object.fromEntries(measured.regions.map((r) => [r.id, r.neighbours]));
      expect(meets).toEqual({ 1: 3, 2: 3, 3: 3, 4: 3, 5: 0 });
    });
  });
});
