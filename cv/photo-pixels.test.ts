import { describe, expect, it } from 'vitest';
import { analysisToOriginal, dishToDecoded, pointToDecoded } from './photo-pixels.ts';
import type { PlateAnalysis } from './types.ts';

const decoded: PlateAnalysis = {
  width: 2400,
  height: 1800,
  scale: 0.5,
  dish: {
    cx: 1200,
    cy: 900,
    rx: 800,
    ry: 780,
    angleDeg: 10,
    r: 790,
    agarFraction: 0.95,
    source: 'detected',
  },
  colonies: [
    {
      x: 100,
      y: 50,
      r: 4,
      area: 50,
      cls: 1,
      confidence: 0.9,
      split: false,
      count: 1,
      lab: [80, 0, 10],
      deltaLab: [-5, 2, -20],
    },
  ],
  counts: { blue: 0, cream: 1 },
  classes: [],
  agarLab: [85, 0, 15],
  flags: [],
  timings: {},
  // Spread from a separate object: compiles with and without this field in the core's type.
  ...{ edgeWidthMm: 0.2 },
};

describe('analysisToOriginal', () => {
  it('scales positions and lengths by k, areas by k², and keeps colours and counts', () => {
    const out = analysisToOriginal(decoded, 1.6667, 4000, 3000);
    expect(out.width).toBe(4000);
    expect(out.scale).toBeCloseTo(0.5 / 1.6667, 6);
    expect(out.dish?.cx).toBeCloseTo(2000, 1);
    expect(out.dish?.angleDeg).toBe(10);
    const c = out.colonies[0]!;
    expect([c.x, c.y, c.r]).toEqual([100 * 1.6667, 50 * 1.6667, 4 * 1.6667]);
    expect(c.area).toBeCloseTo(50 * 1.6667 ** 2, 6);
    expect(c.deltaLab).toEqual([-5, 2, -20]);
    expect(out.counts).toEqual(decoded.counts);
  });

  it('scales the objects of neither colour too: the person taps them in the photo', () => {
    const odd = { ...decoded.colonies[0]!, x: 300, y: 200 };
    const out = analysisToOriginal({ ...decoded, neither: [odd] }, 2, 4800, 3600);
    expect(out.neither?.map((c) => [c.x, c.y, c.r, c.area])).toEqual([[600, 400, 8, 200]]);
  });

  it("scales the considered objects' positions and radii, and leaves their sizes in mm", () => {
    const candidate = {
      id: 7,
      x: 120,
      y: 60,
      r: 5,
      dL: -12,
      da: 3,
      db: -18,
      dE: 21,
      radiusMm: 0.6,
      elongation: 1.1,
      ridgeVariation: 0.2,
      wallMm: 9,
      verdict: 'rejected' as const,
      plateColonies: 40,
    };
    const out = analysisToOriginal({ ...decoded, candidates: [candidate] }, 2, 4800, 3600);
    expect(out.candidates).toEqual([{ ...candidate, x: 240, y: 120, r: 10 }]);
    expect(analysisToOriginal(decoded, 2, 4800, 3600).candidates).toBeUndefined();
  });

  it('a tapped point goes to the decoded copy by the same k', () => {
    expect(pointToDecoded({ x: 600, y: 400, cls: 'red' }, 2)).toEqual({
      x: 300,
      y: 200,
      cls: 'red',
    });
  });

  it('a dish placed in original pixels round-trips through the decoded copy', () => {
    const d = { cx: 2000, cy: 1500, rx: 1300, ry: 1290, angleDeg: 0 };
    const back = dishToDecoded(d, 2);
    expect(back).toEqual({ cx: 1000, cy: 750, rx: 650, ry: 645, angleDeg: 0 });
  });
});
