import { describe, expect, it } from 'vitest';
import { frameForDish, TARGET_PX_PER_MM, toOriginal, toWorking } from './frame.ts';

describe('frameForDish', () => {
  it('resamples a big dish to the target resolution and never upsamples a small one', () => {
    const big = frameForDish({ cx: 2000, cy: 1500, rx: 1300, ry: 1300 }, 4000, 3000, 90);
    // The scale is a multiple of 1/64 (banded-resize.ts): the nearest to the target.
    expect(big.scale * 64).toBe(Math.round(big.scale * 64));
    expect(Math.abs(big.mmPerPx * TARGET_PX_PER_MM - 1)).toBeLessThan(1 / (2 * 64 * big.scale));
    const small = frameForDish({ cx: 300, cy: 200, rx: 150, ry: 150 }, 640, 480, 90);
    expect(small.scale).toBe(1);
  });

  it('converts between original and working pixels both ways', () => {
    const f = frameForDish({ cx: 2000, cy: 1500, rx: 1300, ry: 1250 }, 4000, 3000, 90);
    const [x, y] = toWorking(f, 1234.5, 987.25);
    const [x0, y0] = toOriginal(f, x, y);
    expect(x0).toBeCloseTo(1234.5, 9);
    expect(y0).toBeCloseTo(987.25, 9);
  });

  it('keeps the crop inside the photo when the dish runs off an edge', () => {
    const f = frameForDish({ cx: 100, cy: 100, rx: 400, ry: 400 }, 1000, 800, 90);
    expect(f.roi.x).toBe(0);
    expect(f.roi.y).toBe(0);
    expect(f.roi.x + f.roi.width).toBeLessThanOrEqual(1000);
    expect(f.roi.y + f.roi.height).toBeLessThanOrEqual(800);
  });
});
