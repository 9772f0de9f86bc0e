import { describe, expect, it } from 'vitest';
import type { WorkingFrame } from './frame.ts';
import { glareMask } from './glare.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

/**
 * A reflected window whose frame bars cut it into panes 3 mm wide, narrower than the 4 mm a glare
 * patch must hold, beside a clump of six touching white colonies just as light and grey, drawn
 * in 8-bit Lab at quarter resolution (0.4 mm per pixel). The panes are convex (a rectangle's
 * solidity is 1); six touching discs, two by three, fill about 0.81 of their convex hull (6πr²
 * over the hull's 2r·4r + 12r·r + πr², a geometric fact), so only the window is glare.
 */
const QUARTER = 200;
const FRAME: WorkingFrame = {
  roi: { x: 0, y: 0, width: 4 * QUARTER, height: 4 * QUARTER },
  scale: 1,
  width: 4 * QUARTER,
  height: 4 * QUARTER,
  mmPerPx: 0.1,
};
const AGAR = [200, 130, 150, 0];
const LIT = [235, 128, 138, 0];

describe('lid glare', () => {
  it('takes in the narrow panes of a reflected window, and not a clump of white colonies', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const quarter = keep(new cv.Mat(QUARTER, QUARTER, cv.CV_8UC3, AGAR));
      // Two panes 3 mm × 12 mm (7.5 × 30 px) either side of a 0.8 mm (2 px) bar.
      quarter.roi(new cv.Rect(40, 40, 8, 30)).setTo(LIT);
      quarter.roi(new cv.Rect(50, 40, 8, 30)).setTo(LIT);
      // Six touching colonies 3.6 mm (9 px) across, two by three, well away from the window.
      for (const x of [140, 149])
        for (const y of [130, 139, 148]) cv.circle(quarter, new cv.Point(x, y), 4, LIT, -1);
      const agar = keep(new cv.Mat(4 * QUARTER, 4 * QUARTER, cv.CV_8UC1, [255, 0, 0, 0]));

      const glare = keep(glareMask(cv, quarter, agar, FRAME));

      const at = (qx: number, qy: number) => glare.data[4 * qy * glare.cols + 4 * qx];
      expect(at(44, 55)).toBe(255); // the middle of the left pane
      expect(at(54, 55)).toBe(255); // the right pane
      expect(at(140, 139)).toBe(0); // a colony in the clump
      expect(at(100, 100)).toBe(0); // bare agar
    });
  });
});
