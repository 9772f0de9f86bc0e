import { describe, expect, it } from 'vitest';
import { dilateByDisc } from './disc-dilation.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

const SIDE = 41;
const MIDDLE = 20;

/** The distances from the middle of the pixels a single bright middle pixel reaches. */
async function reach(size: number): Promise<{ covered: number[]; missed: number[] }> {
  const { cv } = await loadOpenCv();
  return withMats((keep) => {
    const img = keep(cv.Mat.zeros(SIDE, SIDE, cv.CV_32F));
    img.data32F[MIDDLE * SIDE + MIDDLE] = 1;
    dilateByDisc(cv, keep, img, size);
    const covered: number[] = [];
    const missed: number[] = [];
    for (let y = 0; y < SIDE; y++)
      for (let x = 0; x < SIDE; x++) {
        const d = Math.hypot(x - MIDDLE, y - MIDDLE);
        (img.data32F[y * SIDE + x]! > 0 ? covered : missed).push(d);
      }
    return { covered, missed };
  });
}

describe('dilation by a disc', () => {
  // A max filter spreads one bright pixel over the structuring element itself (the definition of
  // grey-level dilation, Serra 1982, cited from memory).
  it('spreads a point over the disc for small discs', async () => {
    const { covered, missed } = await reach(9);
    expect(Math.max(...covered)).toBeLessThanOrEqual(4.5);
    expect(Math.min(...missed)).toBeGreaterThan(4);
  });

  it('spreads a point over an octagon between the disc and 1.08 of it for large discs', async () => {
    const radius = 12;
    const { covered, missed } = await reach(2 * radius + 1);
    // Rounding the square's half-side to a pixel leaves the diagonals up to a pixel short.
    expect(Math.min(...missed)).toBeGreaterThan(radius - 1);
    expect(Math.max(...covered)).toBeLessThanOrEqual(radius / Math.cos(Math.PI / 8) + 0.5);
  });
});
