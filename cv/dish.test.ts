import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { varietyScene } from '../fixtures/scene-variety.ts';
import { detectDish, ellipseRadius } from './dish.ts';
import { loadOpenCv } from './opencv.ts';

/** Ground truth from the seeded generator (fixtures/), which shares no code with cv/. */
async function detect(scene: Parameters<typeof generatePlate>[0]) {
  const { cv } = await loadOpenCv();
  const { image, truth } = generatePlate(scene);
  const dish = detectDish(cv, image);
  return { dish, truth };
}

describe('detectDish', () => {
  for (const scene of [
    { seed: 1 },
    { seed: 2, tilt: 0.9 },
    { seed: 3, offset: [0.05, -0.04] as [number, number], dishFraction: 0.7 },
    { seed: 4, colours: 'pink-yellow' as const, lighting: 0.8 },
  ]) {
    it(`finds the agar edge within 0.3 mm (${JSON.stringify(scene)})`, async () => {
      const { dish, truth } = await detect({ ...scene, width: 1600, height: 1200 });
      expect(dish).not.toBeNull();
      const tolerance = 0.3 / truth.mmPerPixel;
      expect(Math.abs(dish!.cx - truth.dish.cx)).toBeLessThan(tolerance);
      expect(Math.abs(dish!.cy - truth.dish.cy)).toBeLessThan(tolerance);
      const major = Math.max(dish!.rx, dish!.ry);
      const minor = Math.min(dish!.rx, dish!.ry);
      expect(Math.abs(major - Math.max(truth.dish.agarRx, truth.dish.agarRy))).toBeLessThan(
        tolerance,
      );
      expect(Math.abs(minor - Math.min(truth.dish.agarRx, truth.dish.agarRy))).toBeLessThan(
        tolerance,
      );
    });
  }

  it('stays within 0.4 mm over 18 varied photos (three colour schemes, tilt, lamp, clutter)', async () => {
    const errorsMm: number[] = [];
    for (const colours of ['blue-cream', 'red-white', 'pink-yellow'] as const) {
      for (let seed = 1; seed <= 6; seed++) {
        const scene = varietyScene(seed, { colours, width: 1600, height: 1200 });
        const { dish, truth } = await detect(scene);
        const t = truth.dish;
        const e = Math.max(
          Math.abs(dish!.cx - t.cx),
          Math.abs(dish!.cy - t.cy),
          Math.abs(Math.max(dish!.rx, dish!.ry) - Math.max(t.agarRx, t.agarRy)),
          Math.abs(Math.min(dish!.rx, dish!.ry) - Math.min(t.agarRx, t.agarRy)),
        );
        errorsMm.push(e * truth.mmPerPixel);
      }
    }
    expect(Math.max(...errorsMm)).toBeLessThan(0.4);
  }, 60_000);

  it('returns null for a photo of the bench alone', async () => {
    const { cv } = await loadOpenCv();
    const w = 640;
    const h = 480;
    const data = new Uint8ClampedArray(w * h * 4);
    for (let i = 0; i < w * h; i++) data.set([100 + (i % 7), 98, 95, 255], i * 4);
    const dish = detectDish(cv, { width: w, height: h, data });
    expect(dish).toBeNull();
  });
});

describe('ellipseRadius', () => {
  it('is 1 on the boundary whatever the rotation', () => {
    const e = { cx: 10, cy: 20, rx: 5, ry: 3, angleDeg: 30 };
    const a = (30 * Math.PI) / 180;
    expect(ellipseRadius(e, 10 + 5 * Math.cos(a), 20 + 5 * Math.sin(a))).toBeCloseTo(1, 10);
    expect(ellipseRadius(e, 10 - 3 * Math.sin(a), 20 + 3 * Math.cos(a))).toBeCloseTo(1, 10);
    expect(ellipseRadius(e, 10, 20)).toBe(0);
  });
});
