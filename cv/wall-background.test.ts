import { describe, expect, it } from 'vitest';
import { type Keep, withMats } from './mat-scope.ts';
import { loadOpenCv, type Mat, type OpenCv } from './opencv.ts';
import { followWall } from './wall-background.ts';

/**
 * A dish drawn in 8-bit Lab with what the agar looks like at the wall: a meniscus ring that
 * darkens the agar steeply towards the wall, a dark colony in that ring, and a run of pen dashes
 * along the rim (three quarters ink over 15 mm). The background must follow the ring across the
 * wall and keep the colony and the ink out of it: a median window along the wall holds the ring
 * and is longer than a colony (the definition of a median filter's breakdown, half the window),
 * and the windows the ink fills are outliers among the ring's windows round the dish (Hampel
 * identifier, Davies & Gather 1993, cited from memory).
 */
const MM_PER_PX = 0.1;
const SIZE = 400;
const C = 200;
const R = 180;
const AGAR: [number, number, number] = [170, 150, 145];
const INK: [number, number, number] = [60, 120, 150];
const COLONY: [number, number, number] = [90, 175, 150];
/** The meniscus: L* (8-bit) lower by up to 40 at the wall, falling off over 0.6 mm. */
const meniscus = (depthPx: number) => Math.round(40 * Math.exp(-depthPx / 6));
const DISH = { cx: C, cy: C, rx: R, ry: R, angleDeg: 0, agarFraction: 1 };

function drawPlate(cv: OpenCv, keep: Keep): Mat {
  const lab8 = keep(new cv.Mat(SIZE, SIZE, cv.CV_8UC3, [...AGAR, 0]));
  const d = lab8.data;
  for (let y = 0; y < SIZE; y++)
    for (let x = 0; x < SIZE; x++) {
      const depth = R - Math.hypot(x - C, y - C);
      if (depth >= 0) d[(y * SIZE + x) * 3] = AGAR[0] - meniscus(depth);
    }
  // The colony: 1.6 mm across, its centre 1.2 mm in from the wall, straight below the centre.
  cv.circle(lab8, new cv.Point(C, C + R - 12), 8, [...COLONY, 0], -1);
  // Pen dashes along the rim at the top, 1.2 mm long every 1.6 mm over 15 mm, 1.4–2 mm deep.
  for (let s = -72; s < 76; s += 16) {
    for (let t = 0; t < 12; t++) {
      const angle = -Math.PI / 2 + (s + t) / (R - 17);
      for (let depth = 14; depth <= 20; depth++) {
        const x = Math.round(C + (R - depth) * Math.cos(angle));
        const y = Math.round(C + (R - depth) * Math.sin(angle));
        d.set(INK, (y * SIZE + x) * 3);
      }
    }
  }
  return lab8;
}

describe('the background next to the dish wall', () => {
  it('follows the meniscus ring and leaves a colony and writing on the rim out', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const lab8 = drawPlate(cv, keep);
      // A background that knows nothing of the ring, as the 9 mm median gives it.
      const background8 = keep(new cv.Mat(SIZE, SIZE, cv.CV_8UC3, [...AGAR, 0]));

      followWall(cv, lab8, background8, DISH, MM_PER_PX);

      const at = (x: number, y: number) => {
        const i = (y * SIZE + x) * 3;
        return [...background8.data.subarray(i, i + 3)];
      };
      const near = (v: number[], want: readonly number[], tolerance: number) => {
        for (const [k, c] of v.entries())
          expect(Math.abs(c - want[k]!)).toBeLessThanOrEqual(tolerance);
      };
      const ring = (depth: number): [number, number, number] => [
        AGAR[0] - meniscus(depth),
        AGAR[1],
        AGAR[2],
      ];
      // On the ring, left of the centre, 0.3 and 0.8 mm in: the meniscus's own shade.
      near(at(C - R + 3, C), ring(3), 4);
      near(at(C - R + 8, C), ring(8), 3);
      // The colony's centre: the ring at its depth, not the colony.
      near(at(C, C + R - 12), ring(12), 3);
      // The middle of a pen dash: agar, not ink.
      near(at(C, C - R + 17), ring(17), 3);
      // Beyond the band (3 mm), the median background is left as it was.
      near(at(C + R - 40, C), AGAR, 0);
    });
  });
});
