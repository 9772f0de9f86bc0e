import { describe, expect, it } from 'vitest';
import { selectCandidates } from './candidates.ts';
import type { ComponentStats, RegionStats } from './measure.ts';

const MM_PER_PX = 0.1;
const RADIUS = 5;
const THRESHOLD = 5;
const COLONIES = 6;

/**
 * A row of six touching colonies of radius 5 px, one watershed region each: as a blob it is six
 * times longer than its widest disc and its ridge hardly varies (the colonies overlap), which is
 * the shape of a pen line. Deep red on pink agar (ΔE ≈ 22), far above the threshold.
 */
function row(bumps: number): { regions: RegionStats[]; components: ComponentStats[] } {
  const area = Math.PI * RADIUS ** 2;
  const regions = Array.from({ length: COLONIES }, (_, i) => ({
    id: i + 1,
    area,
    x: 20 + 2 * RADIUS * i,
    y: 40,
    lab: [40, 30, 10] as const,
    backgroundLab: [60, 20, 10] as const,
    contrast: 20,
    halfWidth: RADIUS,
    peak: 25,
    steepest: 4,
    component: 1,
  }));
  const components = [
    {
      id: 1,
      area: COLONIES * area,
      halfWidth: RADIUS,
      regions: COLONIES,
      rimPixels: 0,
      meanDistance: RADIUS / 2,
      ridgeVariation: 0.1,
      bumps,
    },
  ];
  return { regions, components };
}

function kept(bumps: number): number {
  const { regions, components } = row(bumps);
  return selectCandidates(
    regions,
    components,
    RADIUS,
    MM_PER_PX,
    THRESHOLD,
    THRESHOLD,
    () => false,
    () => false,
  ).candidates.length;
}

describe('selectCandidates: stroke-shaped blobs', () => {
  it('keeps a row of colonies whose domes show as contrast bumps', () => {
    expect(kept(COLONIES)).toBe(COLONIES);
    expect(kept(COLONIES / 2)).toBe(COLONIES);
  });

  it('takes the same shape with bumps only at its ends for a pen line', () => {
    expect(kept(2)).toBe(0);
    expect(kept(0)).toBe(0);
  });
});
