import { describe, expect, it } from 'vitest';
import { followGlare, GLARE_SEGMENT_MM } from './glare-background.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

/**
 * A reflected window on the agar, drawn in 8-bit Lab: a bright patch with a dark bar of its frame
 * across it, and colonies inside it, darker (a red colony) and lighter (a white one) than the
 * reflection. What a background under glare must do follows from the definitions of opening and
 * closing (Soille 2003, ch. 4 and 9): a segment longer than a disc fits along a band and across a
 * step edge, so both are kept, and inside a disc in no orientation, so the disc is removed.
 */
const MM_PER_PX = 0.1;
const AGAR: [number, number, number] = [150, 150, 140];
const GLARE: [number, number, number] = [230, 133, 130];
const BAR: [number, number, number] = [170, 148, 138];
const RED: [number, number, number] = [170, 170, 135];
const WHITE: [number, number, number] = [250, 128, 128];

describe('the background under lid glare', () => {
  it('follows the reflection, its edges and its frame, and leaves the colonies out', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const lab8 = keep(new cv.Mat(240, 320, cv.CV_8UC3, [...AGAR, 0]));
      // The reflection: a box 60..260 × 40..200, with a frame bar 7 px (0.7 mm) wide across it.
      lab8.roi(new cv.Rect(60, 40, 200, 160)).setTo([...GLARE, 0]);
      lab8.roi(new cv.Rect(60, 116, 200, 7)).setTo([...BAR, 0]);
      // Two colonies 1.6 mm across, well inside the 4 mm segments (GLARE_SEGMENT_MM).
      expect(1.6).toBeLessThan(GLARE_SEGMENT_MM / 2);
      cv.circle(lab8, new cv.Point(110, 75), 8, [...RED, 0], -1);
      cv.circle(lab8, new cv.Point(200, 165), 8, [...WHITE, 0], -1);
      const glare = keep(cv.Mat.zeros(240, 320, cv.CV_8UC1));
      glare.roi(new cv.Rect(60, 40, 200, 160)).setTo([255, 0, 0, 0]);
      // A background that knows nothing of the glare, as the wide median gives it.
      const background8 = keep(new cv.Mat(240, 320, cv.CV_8UC3, [...AGAR, 0]));

      followGlare(cv, lab8, background8, glare, MM_PER_PX);

      const at = (x: number, y: number) => {
        const i = (y * 320 + x) * 3;
        return [...background8.data.subarray(i, i + 3)];
      };
      const near = (v: number[], want: readonly number[], tolerance: number) => {
        for (const [k, c] of v.entries())
          expect(Math.abs(c - want[k]!)).toBeLessThanOrEqual(tolerance);
      };
      near(at(110, 75), GLARE, 3); // the red colony's centre: the reflection, not the colony
      near(at(200, 165), GLARE, 3); // the white colony's centre
      near(at(160, 119), BAR, 6); // the frame bar is part of the background
      near(at(66, 60), GLARE, 3); // just inside the reflection's edge
      near(at(20, 20), AGAR, 0); // outside the glare nothing changes
    });
  });
});
