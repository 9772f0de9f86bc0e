import { describe, expect, it } from 'vitest';
import { labToRgb, linearToSrgb, rgbToLab, srgbToLinear } from './colour.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';
import type { Lab } from './types.ts';

describe('rgbToLab', () => {
  // Reference L*a*b* from the Lindbloom calculator (D65, sRGB) as asserted in scikit-image's
  // test_rgb2lab_brucelindbloom (skimage/color/tests/test_colorconv.py). Implementations differ in
  // the 4th decimal (matrix rounding), so the tolerance is 0.03 (common practice).
  const cases: [string, [number, number, number], Lab][] = [
    ['white', [255, 255, 255], [100, 0, 0]],
    ['black', [0, 0, 0], [0, 0, 0]],
    ['red', [255, 0, 0], [53.2408, 80.0925, 67.2032]],
    ['green', [0, 255, 0], [87.7347, -86.1827, 83.1793]],
    ['blue', [0, 0, 255], [32.297, 79.1875, -107.8602]],
    ['yellow', [255, 255, 0], [97.1393, -21.5537, 94.478]],
    ['cyan', [0, 255, 255], [91.1132, -48.0875, -14.1312]],
    ['magenta', [255, 0, 255], [60.3242, 98.2343, -60.8249]],
  ];
  for (const [name, rgb, lab] of cases) {
    it(`${name} matches the Lindbloom reference`, () => {
      const got = rgbToLab(...rgb);
      for (let i = 0; i < 3; i++) expect(Math.abs(got[i]! - lab[i]!)).toBeLessThan(0.03);
    });
  }

  it('grey 128/255 has L* 53.585 and no chroma (computed with scikit-image rgb2lab, Debian python3-skimage 0.19.3)', () => {
    const [L, a, b] = rgbToLab(128, 128, 128);
    expect(L).toBeCloseTo(53.585, 2);
    expect(Math.abs(a)).toBeLessThan(0.01);
    expect(Math.abs(b)).toBeLessThan(0.01);
  });

  it('round-trips through labToRgb for a spread of colours', () => {
    const colours: [number, number, number][] = [
      [12, 200, 90],
      [240, 230, 200],
      [40, 60, 180],
      [250, 250, 250],
    ];
    for (const [r, g, b] of colours) {
      expect(labToRgb(rgbToLab(r, g, b))).toEqual([r, g, b]);
    }
  });
});

describe('sRGB transfer functions (IEC 61966-2-1, as in skimage colorconv.py)', () => {
  it('are inverse to each other and continuous at the break points', () => {
    for (const c of [0, 0.02, 0.04045, 0.3, 0.8, 1])
      expect(linearToSrgb(srgbToLinear(c))).toBeCloseTo(c, 6);
    expect(srgbToLinear(0.04045)).toBeCloseTo(0.04045 / 12.92, 12);
  });
});

describe("opencv's 8-bit COLOR_RGB2Lab, which every image goes through", () => {
  it('agrees with the reference conversion above to within its byte quantisation', async () => {
    const { cv } = await loadOpenCv();
    const colours: [number, number, number][] = [
      [255, 0, 0],
      [0, 0, 255],
      [240, 230, 200],
      [90, 110, 170],
      [128, 128, 128],
    ];
    const got = withMats((keep) => {
      const rgb = keep(cv.matFromArray(1, colours.length, cv.CV_8UC3, colours.flat()));
      const lab = keep(new cv.Mat());
      cv.cvtColor(rgb, lab, cv.COLOR_RGB2Lab);
      return Array.from(lab.data);
    });
    colours.forEach((c, i) => {
      const [L, a, b] = rgbToLab(...c);
      expect(Math.abs((got[3 * i]! * 100) / 255 - L)).toBeLessThan(0.6);
      expect(Math.abs(got[3 * i + 1]! - 128 - a)).toBeLessThan(1.1);
      expect(Math.abs(got[3 * i + 2]! - 128 - b)).toBeLessThan(1.1);
    });
  });
});
