import { describe, expect, it } from 'vitest';
import { type PlateContext, selectCandidates } from './candidates.ts';
import type { ComponentStats, RegionStats } from './measure.ts';

const MM_PER_PX = 0.1;
const RADIUS = 5;
const THRESHOLD = 5;
const COLONIES = 6;
/** The smallest colony's disc at this scale (candidates.ts, MIN_COLONY_RADIUS_MM = 0.22 mm). */
const MIN_AREA = Math.PI * (0.22 / MM_PER_PX) ** 2;
const PLATE: PlateContext = {
  typicalRadius: RADIUS,
  mmPerPx: MM_PER_PX,
  scale: 1,
  threshold: THRESHOLD,
  faintThreshold: THRESHOLD,
  nearWall: () => false,
  nearGlare: () => false,
};

/** Deep red on pink agar (ΔE ≈ 22), far above the threshold: a colony of radius 5 px. */
function colony(id: number, x: number, y: number, over: Partial<RegionStats> = {}): RegionStats {
  return {
    id,
    area: Math.PI * RADIUS ** 2,
    x,
    y,
    lab: [40, 30, 10],
    backgroundLab: [60, 20, 10],
    contrast: 20,
    halfWidth: RADIUS,
    peak: 25,
    steepest: 4,
    component: id,
    bumps: 1,
    neighbours: 0,
    ...over,
  };
}

/** A blob of round shape holding `regions`. */
function blob(id: number, area: number, over: Partial<ComponentStats> = {}): ComponentStats {
  return {
    id,
    area,
    halfWidth: Math.sqrt(area / Math.PI),
    regions: 1,
    rimPixels: 0,
    meanDistance: Math.sqrt(area / Math.PI) / 3,
    ridgeVariation: 0,
    bumps: 1,
    ...over,
  };
}

function keptIds(
  regions: RegionStats[],
  components: ComponentStats[],
  plate: Partial<PlateContext> = {},
): number[] {
  return selectCandidates(regions, components, { ...PLATE, ...plate })
    .candidates.map((c) => c.region.id)
    .sort((a, b) => a - b);
}

/**
 * One long blob of `pieces` watershed regions `spacing` apart along a line, as long as `COLONIES`
 * widest discs, its ridge varying by `ridgeVariation`; the first `bumps` pieces hold a bump.
 */
function longBlob(
  pieces: number,
  spacing: number,
  ridgeVariation: number,
  bumps: number,
): { regions: RegionStats[]; components: ComponentStats[] } {
  const regions = Array.from({ length: pieces }, (_, i) =>
    colony(i + 1, 20 + spacing * i, 40, { component: 1, bumps: i < bumps ? 1 : 0 }),
  );
  const components = [
    blob(1, COLONIES * Math.PI * RADIUS ** 2, {
      halfWidth: RADIUS,
      regions: pieces,
      meanDistance: RADIUS / 2,
      ridgeVariation,
      bumps,
    }),
  ];
  return { regions, components };
}

/**
 * A row of six touching colonies, one watershed region each: as a blob it is six times longer
 * than its widest disc and its ridge hardly varies (the colonies overlap), which is the shape of
 * a pen line.
 */
const row = (bumps: number) => longBlob(COLONIES, 2 * RADIUS, 0.1, bumps);

describe('selectCandidates: stroke-shaped blobs', () => {
  const kept = (bumps: number) => keptIds(row(bumps).regions, row(bumps).components).length;

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
 * A letter cut by the watershed into twelve pieces: six times longer than its widest disc, its
 * ridge varying as much as a chain of discs' (0.25, the corners and joins), one contrast bump at a
 * stroke's end. The same blob with a dome in every other piece is a clump of colonies.
 */
const letter = (bumps: number) => longBlob(2 * COLONIES, RADIUS, 0.25, bumps);

describe('selectCandidates: a long blob of many pieces with hardly a dome', () => {
  const kept = (bumps: number) => keptIds(letter(bumps).regions, letter(bumps).components).length;

  it('is writing, whatever its ridge', () => {
    expect(kept(1)).toBe(0);
  });

  it('is a clump of colonies when its pieces show domes', () => {
    expect(kept(COLONIES)).toBeGreaterThan(0);
  });

  // Words on a plates-dev photo: 3 domes in 32 pieces (a letter's ends and blots). Before the
  // floor of three domes was dropped, three were enough to keep all 32 pieces.
  it('is writing with three domes in thirty pieces, and a clump with one in six', () => {
    const words = (bumps: number) => longBlob(30, RADIUS / 2, 0.25, bumps);
    expect(keptIds(words(3).regions, words(3).components)).toEqual([]);
    expect(keptIds(words(5).regions, words(5).components).length).toBeGreaterThan(0);
  });
});

/**
 * A small spot of the agar's own lightness but tinted (Δb* −12): a blue-grey colony on yellow agar
 * can match the agar's L*, and JPEG's half-resolution chroma leaves such a tint beside a
 * saturated colony too. Alone or beside one of the same tint it is a colony; beside one at least
 * twice as tinted it is that colony's chroma ghost.
 */
function tintedSpot(neighbourTint: number | null): number[] {
  const spot = colony(1, 50, 50, {
    area: 40,
    lab: [70, 0, 8],
    backgroundLab: [70, 0, 20],
    contrast: 12,
    halfWidth: 3.5,
  });
  const regions = [spot];
  const components = [blob(1, 40)];
  if (neighbourTint !== null) {
    regions.push(
      colony(2, 62, 50, {
        area: 200,
        lab: [50, 0, 20 - neighbourTint],
        contrast: 30,
        halfWidth: 8,
      }),
    );
    components.push(blob(2, 200));
  }
  return keptIds(regions, components, { scale: 0.5 }).filter((id) => id === 1);
}

describe('selectCandidates: tint without lightness', () => {
  it('keeps a tinted spot of the agar own lightness when no stronger tint is beside it', () => {
    expect(tintedSpot(null)).toEqual([1]);
    expect(tintedSpot(15)).toEqual([1]);
  });

  it('drops it as a chroma ghost beside a colony at least twice as tinted', () => {
    expect(tintedSpot(30)).toEqual([]);
  });
});

/**
 * A lamp's arc as thick as a colony, of a colour three round colonies elsewhere share (so no pen
 * can be learned from it for the whole plate), with one colony of that colour sitting on it.
 */
describe('selectCandidates: pieces of a line as thick as a colony', () => {
  it('keeps the piece holding a round bump and drops the rest of the line', () => {
    const line = row(0);
    const regions = line.regions.map((r) => ({ ...r, bumps: r.id === 3 ? 1 : 0 }));
    const components = [...line.components];
    for (let i = 0; i < 3; i++) {
      const id = COLONIES + 1 + i;
      regions.push(colony(id, 20 + 15 * i, 90));
      components.push(blob(id, Math.PI * RADIUS ** 2));
    }
    expect(keptIds(regions, components)).toEqual([3, 7, 8, 9]);
  });

  it('keeps a pale colony against dark writing even when it shows no bump of its own', () => {
    const line = row(0);
    const regions = line.regions.map((r) =>
      r.id === 4 ? { ...r, lab: [72, 14, 4] as const, bumps: 0 } : { ...r, bumps: 0 },
    );
    expect(keptIds(regions, line.components)).toEqual([4]);
  });

  /*
   * A band of reflected tint along the wall (plates-dev photo 8: blue bench light on beige agar),
   * as thick as a colony, differs from the agar in b* alone; its pieces' L* straddle the agar's
   * by a few tenths. White colonies on that agar share its tint, so no pen is usable for the
   * plate. Before the line's own colour was asked, the pieces a shade lighter than the agar were
   * kept (the line's mean is a shade darker) and counted as colonies.
   */
  it('drops the domeless pieces of a line that differs from the agar in tint alone', () => {
    const line = row(0);
    const regions: RegionStats[] = line.regions.map((r) => ({
      ...r,
      lab: [r.id % 2 ? 60.3 : 59.6, 20, 1],
      contrast: 9,
      bumps: 0,
    }));
    const components = [...line.components];
    for (let i = 0; i < 3; i++) {
      const id = COLONIES + 1 + i;
      regions.push(colony(id, 20 + 15 * i, 90, { lab: [64, 20, 2] }));
      components.push(blob(id, Math.PI * RADIUS ** 2));
    }
    expect(keptIds(regions, components)).toEqual([7, 8, 9]);
  });
});

/**
 * A crowded plate of blue-grey colonies on beige agar: nineteen small ones read lighter than the
 * marker ink (a thin layer of pigment), two large round ones are as dark and colourless as it,
 * and a clump of three large ones touches (a blob too long to be round). The two are under a
 * tenth of the round blobs but all of those at least a typical colony thick.
 */
function blueGreyPlate(largeRound: number): {
  regions: RegionStats[];
  components: ComponentStats[];
} {
  const agar = { backgroundLab: [65, 2, 22] as const };
  const inkDark = { ...agar, lab: [45, 0, -4] as const };
  const regions: RegionStats[] = [];
  const components: ComponentStats[] = [];
  for (let i = 0; i < 19; i++) {
    const small = { area: Math.PI * 9, halfWidth: 3, lab: [58, 0, 10] as const, ...agar };
    regions.push(colony(i + 1, 20 + 12 * i, 20, small));
    components.push(blob(i + 1, small.area));
  }
  for (let i = 0; i < largeRound; i++) {
    const large = { area: Math.PI * 36, halfWidth: 6, ...inkDark };
    regions.push(colony(30 + i, 30 + 20 * i, 60, large));
    components.push(blob(30 + i, large.area));
  }
  for (let i = 0; i < 3; i++)
    regions.push(colony(40 + i, 40 + 2 * RADIUS * i, 100, { ...inkDark, component: 40 }));
  components.push(
    blob(40, 3 * Math.PI * RADIUS ** 2, {
      halfWidth: RADIUS,
      regions: 3,
      bumps: 3,
      ridgeVariation: 0.3,
    }),
  );
  return { regions, components };
}

describe('selectCandidates: dark ink against dark colonies', () => {
  const clumpKept = (largeRound: number) => {
    const { regions, components } = blueGreyPlate(largeRound);
    return keptIds(regions, components).filter((id) => id >= 40);
  };

  it('keeps a clump of colonies as dark as ink when the thick round colonies are that dark', () => {
    expect(clumpKept(2)).toEqual([40, 41, 42]);
  });

  it('still takes such a clump for ink when no round colony is that dark', () => {
    expect(clumpKept(0)).toEqual([]);
  });
});

/**
 * A small deep-red colony on pink agar whose tint the blur has washed out: darker than the agar,
 * within a few units of it in a* and b*, too small and faint for the size-and-contrast exemption.
 * Shading looks the same in colour; a colony is a dome.
 */
describe('selectCandidates: grey shades', () => {
  const greyDisc = (bumps: number) =>
    keptIds(
      [
        colony(1, 50, 50, {
          area: 2 * MIN_AREA,
          lab: [52, 33, 10],
          backgroundLab: [60, 35, 10],
          contrast: 8,
          halfWidth: 3,
          bumps,
        }),
      ],
      [blob(1, 2 * MIN_AREA, { bumps })],
    );

  it('drops a small grey shade that is no dome', () => {
    expect(greyDisc(0)).toEqual([]);
  });

  it('keeps it when it holds a round contrast bump', () => {
    expect(greyDisc(1)).toEqual([1]);
  });
});

/**
 * Small pieces: a faint speck just over the threshold, and a piece of a crowded clump that the
 * watershed left with less than the smallest colony's disc (a neighbour's basin took its flank).
 * Each is kept only as a dome.
 */
describe('selectCandidates: small pieces', () => {
  const faintSpeck = (bumps: number) =>
    keptIds(
      [colony(1, 50, 50, { area: 1.5 * MIN_AREA, contrast: 6, halfWidth: 2.5, bumps })],
      [blob(1, 1.5 * MIN_AREA, { bumps })],
    );
  const squeezed = (bumps: number) =>
    keptIds(
      [
        colony(1, 50, 50, { component: 1 }),
        colony(2, 57, 50, { area: 0.7 * MIN_AREA, halfWidth: 2, component: 1, bumps }),
      ],
      [blob(1, Math.PI * RADIUS ** 2 + 0.7 * MIN_AREA, { regions: 2, bumps: 1 + bumps })],
    );

  it('drops a faint speck and a squeezed piece that hold no bump', () => {
    expect(faintSpeck(0)).toEqual([]);
    expect(squeezed(0)).toEqual([1]);
  });

  it('keeps them when they are domes', () => {
    expect(faintSpeck(1)).toEqual([1]);
    expect(squeezed(1)).toEqual([1, 2]);
  });
});

/**
 * A faint blotch of JPEG chroma noise, tinted but of the agar's lightness, beside a faint pale
 * colony of the same strength that is lighter than the agar.
 */
describe('selectCandidates: chroma noise', () => {
  const faint = (lab: readonly [number, number, number]) =>
    keptIds(
      [colony(1, 50, 50, { area: 4 * MIN_AREA, lab, backgroundLab: [70, 0, 20], contrast: 6 })],
      [blob(1, 4 * MIN_AREA)],
    );

  it('drops a faint region that differs from the agar in tint only', () => {
    expect(faint([70.5, 2, 16])).toEqual([]);
  });

  it('keeps a faint region as much lighter than the agar', () => {
    expect(faint([74, 0, 18])).toEqual([1]);
  });
});

describe('the piece between touching colonies', () => {
  // Three colonies of radius R touching in a triangle: the middle of the gap between them lies
  // only R·(2/√3 − 1) ≈ 0.15 R outside each disc (plane geometry), so their soft edges fill it
  // and the foreground is thickest there. The distance map peaks in it and the watershed gives it
  // a small concave piece bounded by all three. A piece meeting three regions and filling a fifth
  // of the disc of its thickness is that junction; a colony cut by its neighbours fills most of
  // its disc.
  const trio = (centre: Partial<RegionStats>) => {
    const third = (id: number, x: number, y: number) =>
      colony(id, x, y, { component: 1, neighbours: 3 });
    const regions = [
      third(1, 20, 20),
      third(2, 30, 20),
      third(3, 25, 28.7),
      colony(4, 25, 23, {
        component: 1,
        area: 0.2 * Math.PI * RADIUS ** 2,
        halfWidth: RADIUS,
        bumps: 0,
        neighbours: 3,
        ...centre,
      }),
    ];
    return keptIds(regions, [blob(1, 3.5 * Math.PI * RADIUS ** 2, { regions: 4, bumps: 3 })]);
  };

  it('drops a domeless piece meeting three colonies that fills little of its disc', () => {
    expect(trio({})).toEqual([1, 2, 3]);
  });

  it('keeps it when it is a dome, fills its disc, or meets fewer than three regions', () => {
    expect(trio({ bumps: 1 })).toEqual([1, 2, 3, 4]);
    expect(trio({ area: 0.8 * Math.PI * RADIUS ** 2 })).toEqual([1, 2, 3, 4]);
    expect(trio({ neighbours: 2 })).toEqual([1, 2, 3, 4]);
  });
});
