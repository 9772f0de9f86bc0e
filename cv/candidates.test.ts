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
    bumps: 1,
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
  return selectCandidates(regions, components, {
    typicalRadius: RADIUS,
    mmPerPx: MM_PER_PX,
    scale: 1,
    threshold: THRESHOLD,
    faintThreshold: THRESHOLD,
    nearWall: () => false,
    nearGlare: () => false,
  }).candidates.length;
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

/**
 * A small spot of the agar's own lightness but tinted (Δb* −12): a blue-grey colony on yellow agar
 * can match the agar's L*, and JPEG's half-resolution chroma leaves such a tint beside a
 * saturated colony too. Alone or beside one of the same tint it is a colony; beside one at least
 * twice as tinted it is that colony's chroma ghost.
 */
function tintedSpot(neighbourTint: number | null): number {
  const spot = {
    id: 1,
    area: 40,
    x: 50,
    y: 50,
    lab: [70, 0, 8] as const,
    backgroundLab: [70, 0, 20] as const,
    contrast: 12,
    halfWidth: 3.5,
    peak: 14,
    steepest: 3,
    component: 1,
    bumps: 1,
  };
  const regions: RegionStats[] = [spot];
  const components: ComponentStats[] = [
    {
      id: 1,
      area: 40,
      halfWidth: 3.5,
      regions: 1,
      rimPixels: 0,
      meanDistance: 1.5,
      ridgeVariation: 0,
      bumps: 1,
    },
  ];
  if (neighbourTint !== null) {
    regions.push({
      ...spot,
      id: 2,
      area: 200,
      x: 62,
      lab: [50, 0, 20 - neighbourTint],
      contrast: 30,
      halfWidth: 8,
      component: 2,
    });
    components.push({ ...components[0]!, id: 2, area: 200, halfWidth: 8 });
  }
  const { candidates } = selectCandidates(regions, components, {
    typicalRadius: RADIUS,
    mmPerPx: MM_PER_PX,
    scale: 0.5,
    threshold: THRESHOLD,
    faintThreshold: THRESHOLD,
    nearWall: () => false,
    nearGlare: () => false,
  });
  return candidates.filter((c) => c.region.id === 1).length;
}

describe('selectCandidates: tint without lightness', () => {
  it('keeps a tinted spot of the agar own lightness when no stronger tint is beside it', () => {
    expect(tintedSpot(null)).toBe(1);
    expect(tintedSpot(15)).toBe(1);
  });

  it('drops it as a chroma ghost beside a colony at least twice as tinted', () => {
    expect(tintedSpot(30)).toBe(0);
  });
});

/**
 * A lamp's arc as thick as a colony, of a colour three round colonies elsewhere share (so no pen
 * can be learned from it for the whole plate), with one colony of that colour sitting on it.
 */
function arcWithColony(): number[] {
  const line = row(0);
  const components = line.components;
  const regions = line.regions.map((r) => ({ ...r, bumps: r.id === 3 ? 1 : 0 }));
  for (let i = 0; i < 3; i++) {
    const id = COLONIES + 1 + i;
    regions.push({ ...regions[0]!, id, x: 20 + 15 * i, y: 90, component: id, bumps: 1 });
    components.push({
      ...components[0]!,
      id,
      area: regions[0]!.area,
      regions: 1,
      ridgeVariation: 0,
      bumps: 1,
    });
  }
  return selectCandidates(regions, components, {
    typicalRadius: RADIUS,
    mmPerPx: MM_PER_PX,
    scale: 1,
    threshold: THRESHOLD,
    faintThreshold: THRESHOLD,
    nearWall: () => false,
    nearGlare: () => false,
  })
    .candidates.map((c) => c.region.id)
    .sort((a, b) => a - b);
}

describe('selectCandidates: pieces of a line as thick as a colony', () => {
  it('keeps the piece holding a round bump and drops the rest of the line', () => {
    expect(arcWithColony()).toEqual([3, 7, 8, 9]);
  });
});

/**
 * A small deep-red colony on pink agar whose tint the blur has washed out: darker than the agar,
 * within a few units of it in a* and b*, too small and faint for the size-and-contrast exemption.
 * Shading looks the same in colour; a colony is a dome.
 */
function greyDisc(bumps: number): number {
  const area = 2 * Math.PI * (0.22 / MM_PER_PX) ** 2;
  const region = {
    id: 1,
    area,
    x: 50,
    y: 50,
    lab: [52, 33, 10] as const,
    backgroundLab: [60, 35, 10] as const,
    contrast: 8,
    halfWidth: 3,
    peak: 10,
    steepest: 2,
    component: 1,
    bumps,
  };
  const component = {
    id: 1,
    area,
    halfWidth: 3,
    regions: 1,
    rimPixels: 0,
    meanDistance: 1.3,
    ridgeVariation: 0,
    bumps,
  };
  return selectCandidates([region], [component], {
    typicalRadius: RADIUS,
    mmPerPx: MM_PER_PX,
    scale: 1,
    threshold: THRESHOLD,
    faintThreshold: THRESHOLD,
    nearWall: () => false,
    nearGlare: () => false,
  }).candidates.length;
}

describe('selectCandidates: grey shades', () => {
  it('drops a small grey shade that is no dome', () => {
    expect(greyDisc(0)).toBe(0);
  });

  it('keeps it when it holds a round contrast bump', () => {
    expect(greyDisc(1)).toBe(1);
  });
});
