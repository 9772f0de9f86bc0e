import { describe, expect, it } from 'vitest';
import { analyzePlate, type RgbaImage } from '../cv/index.ts';
import { generatePlate } from '../fixtures/plate-generator.ts';
import type { PlateScene } from '../fixtures/plate-types.ts';

/**
 * The count must not depend on where the dish sits in the photo, which way up the photo was
 * taken, or the camera's resolution: the same generated plate moved, turned and rescaled.
 */
const BASE: PlateScene = { seed: 77, colonies: 160, fractionClass1: 0.4 };

async function total(image: RgbaImage): Promise<number> {
  const a = await analyzePlate(image);
  return a.colonies.reduce((s, c) => s + c.count, 0);
}

/** Quarter turn clockwise of an RGBA image. */
function rotate90(img: RgbaImage): RgbaImage {
  const { width: w, height: h, data } = img;
  const out = new Uint8ClampedArray(data.length);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const src = 4 * (y * w + x);
      const dst = 4 * (x * h + (h - 1 - y));
      out[dst] = data[src]!;
      out[dst + 1] = data[src + 1]!;
      out[dst + 2] = data[src + 2]!;
      out[dst + 3] = data[src + 3]!;
    }
  }
  return { width: h, height: w, data: out };
}

describe('the count is invariant to', () => {
  it('moving the dish in the frame, turning the photo and changing the camera resolution', async () => {
    const plate = generatePlate(BASE);
    const reference = await total(plate.image);
    const variants = [
      await total(generatePlate({ ...BASE, offset: [0.06, -0.05], dishFraction: 0.75 }).image),
      await total(rotate90(plate.image)),
      await total(generatePlate({ ...BASE, width: 3000, height: 2250 }).image),
    ];
    for (const v of variants) expect(Math.abs(v - reference) / reference).toBeLessThan(0.03);
    expect(Math.abs(reference - 160) / 160).toBeLessThan(0.05);
  }, 60_000);
});
