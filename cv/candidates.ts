import type { ComponentStats, RegionStats } from './measure.ts';

/**
 * Turns measured regions into colony candidates: drops what is not a colony by size and shape,
 * and estimates how many colonies an unsplittable clump holds.
 *
 * - Specks (dust, agar flaws): blobs smaller than a disc of MIN_COLONY_RADIUS_MM.
 * - Strokes (marker-pen writing seen through the lid): blobs far longer than they are thick and
 *   thinner than a typical colony. A chain of touching colonies is long too, but as thick as its
 *   colonies, so it stays.
 * - Wall glints: blobs on the rim of the counting area that are thinner than half a typical
 *   colony. Reflections and the wall's inner face show as thin arcs there; a colony growing
 *   against the wall is as thick as any other and is kept.
 * - Clumps: a region more than CLUMP_AREA_RATIO typical single-colony areas is counted as
 *   round(area / typical area) colonies and marked, since the watershed could not split it.
 * Sizes are in working pixels; `mmPerPx` converts the millimetre limits.
 */
const MIN_COLONY_RADIUS_MM = 0.2;
const STROKE_ELONGATION = 4.5;
const STROKE_THINNESS = 0.7;
const CLUMP_AREA_RATIO = 2.3;
const WALL_THINNESS = 0.5;

export interface Candidate {
  region: RegionStats;
  split: boolean;
  count: number;
}

export interface CandidateResult {
  candidates: Candidate[];
  rejected: { specks: number; strokes: number; wall: number };
  typicalArea: number;
}

export function selectCandidates(
  regions: RegionStats[],
  components: ComponentStats[],
  typicalRadius: number,
  mmPerPx: number,
): CandidateResult {
  const minArea = Math.PI * (MIN_COLONY_RADIUS_MM / mmPerPx) ** 2;
  const byId = new Map(components.map((c) => [c.id, c]));
  const rejected = { specks: 0, strokes: 0, wall: 0 };
  const verdict = new Map<number, 'keep' | keyof typeof rejected>();
  for (const c of components) {
    const v = componentVerdict(c, minArea, typicalRadius);
    verdict.set(c.id, v);
    if (v !== 'keep') rejected[v]++;
  }
  const kept = regions.filter(
    (r) => verdict.get(r.component) === 'keep' && r.area >= minArea * 0.5,
  );
  const typicalArea = typicalSingleArea(kept, byId) || Math.PI * typicalRadius ** 2;
  const candidates = kept.map((region) => {
    const ratio = region.area / typicalArea;
    return {
      region,
      split: (byId.get(region.component)?.regions ?? 1) > 1,
      count: ratio > CLUMP_AREA_RATIO ? Math.round(ratio) : 1,
    };
  });
  return { candidates, rejected, typicalArea };
}

function componentVerdict(
  c: ComponentStats,
  minArea: number,
  typicalRadius: number,
): 'keep' | 'specks' | 'strokes' | 'wall' {
  if (c.area < minArea) return 'specks';
  const elongation = c.area / (Math.PI * Math.max(1, c.halfWidth) ** 2);
  if (elongation > STROKE_ELONGATION && c.halfWidth < STROKE_THINNESS * typicalRadius)
    return 'strokes';
  if (c.rimPixels > 0 && c.halfWidth < WALL_THINNESS * typicalRadius) return 'wall';
  return 'keep';
}

/** Median area of regions that were alone in their blob: the size of one colony on this plate. */
function typicalSingleArea(regions: RegionStats[], comps: Map<number, ComponentStats>): number {
  const singles = regions
    .filter((r) => comps.get(r.component)?.regions === 1)
    .map((r) => r.area)
    .sort((a, b) => a - b);
  const pool = singles.length >= 3 ? singles : regions.map((r) => r.area).sort((a, b) => a - b);
  return pool.length ? pool[pool.length >> 1]! : 0;
}
