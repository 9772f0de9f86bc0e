import { describe, expect, it } from 'vitest';
import { deltaE2000, labToRgb, linearToSrgb, rgbToLab, srgbToLinear } from './colour.ts';
import type { Lab } from './types.ts';

describe('rgbToLab', () => {
  // Reference L*a*b* from the Lindbloom calculator (D65, sRGB) as asserted in scikit-image's
  // test_rgb2lab_brucelindbloom (skimage/color/tests/test_colorconv.py). Implementations differ in
  // the 4th decimal (matrix rounding), so the tolerance is 0.03 as check-values.md §7 advises.
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

  it('grey 128/255 has L* 53.585 and no chroma (check-values.md §7, computed with skimage)', () => {
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

describe('deltaE2000', () => {
  // Sharma, Wu & Dalal 2005, Table 1 (pair number, Lab1, Lab2, ΔE00), via check-values.md §7.
  const table: [number, Lab, Lab, number][] = [
    [1, [50, 2.6772, -79.7751], [50, 0, -82.7485], 2.0425],
    [4, [50, -1.3802, -84.2814], [50, 0, -82.7485], 1.0],
    [7, [50, 0, 0], [50, -1, 2], 2.3669],
    [9, [50, 2.49, -0.001], [50, -2.49, 0.0009], 7.1792],
    [11, [50, 2.49, -0.001], [50, -2.49, 0.0011], 7.2195],
    [13, [50, -0.001, 2.49], [50, 0.0009, -2.49], 4.8045],
    [15, [50, -0.001, 2.49], [50, 0.0011, -2.49], 4.7461],
    [16, [50, 2.5, 0], [50, 0, -2.5], 4.3065],
    [17, [50, 2.5, 0], [73, 25, -18], 27.1492],
    [19, [50, 2.5, 0], [56, -27, -3], 31.903],
    [25, [60.2574, -34.0099, 36.2677], [60.4626, -34.1751, 39.4387], 1.2644],
    [28, [35.0831, -44.1164, 3.7933], [35.0232, -40.0716, 1.5901], 1.8645],
    [31, [90.8027, -2.0831, 1.441], [91.1528, -1.6435, 0.0447], 1.4441],
    [34, [2.0776, 0.0795, -1.135], [0.9033, -0.0636, -0.5514], 0.9082],
  ];
  for (const [n, p, q, expected] of table) {
    it(`pair ${n} gives ${expected} both ways round`, () => {
      expect(deltaE2000(p, q)).toBeCloseTo(expected, 4);
      expect(deltaE2000(q, p)).toBeCloseTo(expected, 4);
    });
  }
});
