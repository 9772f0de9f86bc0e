import { describe, expect, it } from 'vitest';
import { deltaE76 } from './colour.ts';
import type { ComponentStats, RegionStats } from './measure.ts';
import type { Lab } from './types.ts';
import { hasPenColour, pensFromStrokes } from './writing.ts';

const AGAR: Lab = [80, 10, 20];
const INK: Lab = [-40, 0, -40];
const RED: Lab = [-20, 30, 10];

/** A piece of stroke 1 whose colour differs from the agar's by `delta`. */
function piece(id: number, delta: Lab): RegionStats {
  return {
    id,
    area: 30,
    x: 10 * id,
    y: 10,
    lab: [AGAR[0] + delta[0], AGAR[1] + delta[1], AGAR[2] + delta[2]],
    backgroundLab: AGAR,
    contrast: Math.hypot(...delta),
    halfWidth: 2,
    peak: Math.hypot(...delta),
    steepest: 2,
    component: 1,
    bumps: 0,
    neighbours: 2,
  };
}

const STROKE: ComponentStats = {
  id: 1,
  area: 600,
  halfWidth: 2,
  regions: 20,
  rimPixels: 0,
  meanDistance: 1,
  ridgeVariation: 0.05,
  bumps: 0,
};

function pensOf(deltas: readonly Lab[]) {
  return pensFromStrokes(
    [STROKE],
    deltas.map((d, i) => piece(i + 1, d)),
    [],
  );
}

describe('pensFromStrokes', () => {
  it("takes the ink's colour from a stroke that touches a few colonies", () => {
    const { usable } = pensOf([...Array(10).fill(INK), ...Array(3).fill(RED)]);
    expect(usable).toHaveLength(1);
    // An area-weighted mean would lie about 11 ΔE*ab towards the colonies' red.
    expect(deltaE76(usable[0]!.delta, INK)).toBeLessThan(0.5);
  });

  it('learns no plate-wide pen from a faint grey line, whose match would take in the agar', () => {
    const { usable, byStroke } = pensOf(Array(8).fill([-4, 2, 3]));
    expect(usable).toEqual([]);
    expect(byStroke.has(1)).toBe(true);
  });

  it('learns no plate-wide pen from a blob of no one colour', () => {
    const pale: Lab = [10, 0, -5];
    const { usable } = pensOf([
      ...Array(4).fill(INK),
      ...Array(4).fill(RED),
      ...Array(4).fill(pale),
    ]);
    expect(usable).toEqual([]);
  });

  it('matches a thicker piece of the same ink, darker and more saturated in proportion', () => {
    const { usable } = pensOf(Array(12).fill(INK));
    const thicker = piece(20, [INK[0] * 1.15, INK[1] * 1.15, INK[2] * 1.15]);
    // 8.5 ΔE*ab from the ink's colour, beyond the least reach (6) a spread of 0 would give.
    expect(
      deltaE76([thicker.lab[0] - AGAR[0], thicker.lab[1] - AGAR[1], thicker.lab[2] - AGAR[2]], INK),
    ).toBeGreaterThan(8);
    expect(hasPenColour(thicker, usable[0]!)).toBe(true);
    expect(hasPenColour(piece(21, RED), usable[0]!)).toBe(false);
  });
});
