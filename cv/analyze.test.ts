import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { analyzePlate } from './analyze.ts';
import { PlateImageError } from './image-input.ts';
import { loadOpenCv } from './opencv.ts';

describe('analyzePlate', () => {
  it('frees every Mat: 50 analyses leave the WASM heap the size it was after the first few', async () => {
    const { cv } = await loadOpenCv();
    const { image } = generatePlate({ seed: 5, width: 800, height: 600, colonies: 60 });
    for (let i = 0; i < 3; i++) await analyzePlate(image);
    const before = cv.HEAP8.length;
    for (let i = 0; i < 50; i++) await analyzePlate(image);
    expect(cv.HEAP8.length).toBe(before);
  }, 120_000);

  it('frees its Mats when it fails part-way too (a dish given outside the photo)', async () => {
    const { cv } = await loadOpenCv();
    const { image } = generatePlate({ seed: 6, width: 800, height: 600, colonies: 30 });
    await analyzePlate(image);
    const before = cv.HEAP8.length;
    for (let i = 0; i < 20; i++) {
      await analyzePlate(image, {
        dish: { cx: 5000, cy: 5000, rx: 300, ry: 300, angleDeg: 0 },
      }).catch(() => undefined);
    }
    expect(cv.HEAP8.length).toBe(before);
  }, 60_000);

  it('flags a photo too coarse for small colonies, and not one of ordinary size', async () => {
    // 480 px for a dish of 0.85 × 480 px over 90 mm: 4.5 px per mm, a 0.5 mm colony 2.3 px across.
    const coarse = await analyzePlate(generatePlate({ seed: 8, width: 640, height: 480 }).image);
    const flag = coarse.flags.find((f) => f.kind === 'coarse-photo');
    expect(flag).toBeDefined();
    expect((flag as { pxPerMm: number }).pxPerMm).toBeCloseTo(4.5, 0);
    const fine = await analyzePlate(generatePlate({ seed: 8 }).image);
    expect(fine.flags.map((f) => f.kind)).not.toContain('coarse-photo');
  }, 30_000);

  it('reports the working scale and keeps coordinates in the photo’s own pixels', async () => {
    const { image, truth } = generatePlate({ seed: 7, width: 3000, height: 2250, colonies: 40 });
    const a = await analyzePlate(image);
    expect(a.width).toBe(3000);
    expect(a.scale).toBeLessThan(1);
    expect(a.dish!.cx).toBeCloseTo(truth.dish.cx, -1);
    for (const c of a.colonies) {
      expect(c.x).toBeGreaterThan(truth.dish.cx - truth.dish.agarRx);
      expect(c.x).toBeLessThan(truth.dish.cx + truth.dish.agarRx);
    }
    expect(Object.keys(a.timings)).toEqual(
      expect.arrayContaining(['dish', 'background', 'foreground', 'split', 'classify']),
    );
  });

  it('uses a dish position the caller gives instead of detecting one', async () => {
    const { image, truth } = generatePlate({ seed: 8, width: 1200, height: 900, colonies: 50 });
    const d = truth.dish;
    const a = await analyzePlate(image, {
      dish: { cx: d.cx, cy: d.cy, rx: d.agarRx, ry: d.agarRy, angleDeg: d.angleDeg },
    });
    expect(a.dish!.source).toBe('given');
    expect(Math.abs(a.colonies.length - 50)).toBeLessThanOrEqual(3);
  });

  // The dish-scale check (`rivalplate accuracy --dish-scale`) must reach the dish the analysis
  // reads: its radii scaled about the same centre, and nothing else about the plate changed.
  it('scales the dish it reads by dishScale, about the same centre', async () => {
    const { image, truth } = generatePlate({ seed: 8, width: 1200, height: 900, colonies: 50 });
    const d = truth.dish;
    const dish = { cx: d.cx, cy: d.cy, rx: d.agarRx, ry: d.agarRy, angleDeg: d.angleDeg };
    const a = await analyzePlate(image, { dish, dishScale: 1.01 });
    expect(a.dish!.rx).toBeCloseTo(1.01 * d.agarRx, 3);
    expect(a.dish!.ry).toBeCloseTo(1.01 * d.agarRy, 3);
    expect(a.dish!.cx).toBeCloseTo(d.cx, 0);
    expect(Math.abs(a.colonies.length - 50)).toBeLessThanOrEqual(3);
  });

  it('flags a photo with no dish in it and does not invent colonies on a bare bench', async () => {
    const w = 640;
    const h = 480;
    const data = new Uint8ClampedArray(w * h * 4);
    for (let i = 0; i < w * h; i++) data.set([92, 90, 88, 255], i * 4);
    const a = await analyzePlate({ width: w, height: h, data });
    expect(a.flags.map((f) => f.kind)).toContain('dish-not-found');
    expect(a.colonies).toEqual([]);
  });

  it('flags writing on the lid, so the person looks for colonies under it', async () => {
    // The generator draws the labels and lists them in its truth (fixtures/ shares no code).
    const scene = { seed: 21, width: 1200, height: 900, colonies: 60 };
    const written = generatePlate({ ...scene, penLabels: ['L3 500', 'D2'] });
    expect(written.truth.distractors.some((d) => d.kind === 'pen')).toBe(true);
    const clean = generatePlate({ ...scene, penMarks: false });
    const kinds = async (image: typeof clean.image) =>
      (await analyzePlate(image)).flags.map((f) => f.kind);
    expect(await kinds(written.image)).toContain('ink');
    expect(await kinds(clean.image)).not.toContain('ink');
  });

  it('refuses buffers that cannot be a picture, saying why', async () => {
    await expect(
      analyzePlate({ width: 10, height: 10, data: new Uint8Array(400) }),
    ).rejects.toThrow(PlateImageError);
    await expect(
      analyzePlate({ width: 100, height: 100, data: new Uint8Array(99) }),
    ).rejects.toThrow(/holds 99 bytes; 100×100 RGBA needs 40000/);
    await expect(
      analyzePlate({ width: 10_000, height: 10_000, data: new Uint8Array(0) }),
    ).rejects.toThrow(/100 MP; decode it at a reduced size/);
  });
});
