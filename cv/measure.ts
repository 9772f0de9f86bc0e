import { lab8ToLab } from './agar.ts';
import type { Mat } from './opencv.ts';
import type { Lab } from './types.ts';

/**
 * Per-region measurements in working pixels, from one pass over the region labels.
 * opencv.js offers per-label area and centroid (connectedComponentsWithStats) but no per-label
 * colour means; one loop over the ~1 MP working image gathers all of it at once instead of a
 * masked cv.mean per colony.
 */
export interface RegionStats {
  id: number;
  area: number;
  x: number;
  y: number;
  /** Mean colour of the region and of the agar background under it. */
  lab: Lab;
  backgroundLab: Lab;
  /** Mean ΔE from the background over the region. */
  contrast: number;
  /** Largest distance-map value inside the region: the radius of the biggest disc it holds. */
  halfWidth: number;
  /** Largest ΔE from the agar in the region, and its steepest ΔE slope per pixel (focus.ts). */
  peak: number;
  steepest: number;
  component: number;
  /** Round contrast bumps (blob-seeds.ts) centred in the region: a colony's dome, not a line. */
  bumps: number;
  /** Other regions it meets across a watershed line (see regionMeetings). */
  neighbours: number;
}

export interface ComponentStats {
  id: number;
  area: number;
  /** Largest distance-map value: half the blob's thickness. */
  halfWidth: number;
  regions: number;
  /** Pixels of the blob on the rim of the counting area (next to the dish wall). */
  rimPixels: number;
  /** Mean distance-map value over the blob (see candidates.ts, strokes). */
  meanDistance: number;
  /** Coefficient of variation of the distance map along the blob's ridge (see candidates.ts). */
  ridgeVariation: number;
  /** Round contrast bumps (blob-seeds.ts) centred on the blob: one per colony dome in it. */
  bumps: number;
}

/**
 * A blob's area over that of the largest disc it holds (π·halfWidth²): about 1 for any round
 * colony, big or small, about 2 for a fused pair, large for a stroke.
 */
export function elongationOf(b: { area: number; halfWidth: number }): number {
  return b.area / (Math.PI * Math.max(1, b.halfWidth) ** 2);
}

export function measureRegions(
  regions: Mat,
  regionCount: number,
  components: Mat,
  componentCount: number,
  distance: Mat,
  lab8: Mat,
  background8: Mat,
  deltaE: Mat,
  slope: Mat,
  rim: Mat,
  ridge: Mat,
  bumps: readonly { x: number; y: number }[] = [],
): { regions: RegionStats[]; components: ComponentStats[] } {
  const n = regionCount + 1;
  const area = new Float64Array(n);
  const sx = new Float64Array(n);
  const sy = new Float64Array(n);
  const sLab = new Float64Array(3 * n);
  const sBg = new Float64Array(3 * n);
  const sDe = new Float64Array(n);
  const comp = new Int32Array(n);
  const rHalf = new Float32Array(n);
  const rPeak = new Float32Array(n);
  const rSteep = new Float32Array(n);
  const G = slope.data32F;
  const cArea = new Float64Array(componentCount + 1);
  const cHalf = new Float32Array(componentCount + 1);
  const cRim = new Int32Array(componentCount + 1);
  const cDist = new Float64Array(componentCount + 1);
  const cRidge: number[][] = Array.from({ length: componentCount + 1 }, () => []);
  const ridgeData = ridge.data;
  const rimData = rim.data;

  const r = regions.data32S;
  const c = components.data32S;
  const d = distance.data32F;
  const L = lab8.data;
  const B = background8.data;
  const E = deltaE.data32F;
  const w = regions.cols;
  const meetings = regionMeetings(regions, regionCount);
  for (let i = 0; i < r.length; i++) {
    const ci = c[i]!;
    if (ci > 0) {
      cArea[ci]!++;
      if (d[i]! > cHalf[ci]!) cHalf[ci] = d[i]!;
      if (rimData[i]) cRim[ci]!++;
      cDist[ci]! += d[i]!;
      if (ridgeData[i]) cRidge[ci]!.push(d[i]!);
    }
    const id = r[i]!;
    if (id <= 0) {
      if (ci > 0 && id === 0) meetings.note(i);
      continue;
    }
    area[id]!++;
    sx[id]! += i % w;
    sy[id]! += (i / w) | 0;
    for (let k = 0; k < 3; k++) {
      sLab[3 * id + k]! += L[3 * i + k]!;
      sBg[3 * id + k]! += B[3 * i + k]!;
    }
    sDe[id]! += E[i]!;
    if (d[i]! > rHalf[id]!) rHalf[id] = d[i]!;
    if (E[i]! > rPeak[id]!) rPeak[id] = E[i]!;
    if (G[i]! > rSteep[id]!) rSteep[id] = G[i]!;
    comp[id] = ci;
  }

  const compRegions = new Int32Array(componentCount + 1);
  const rBumps = bumpsPer(regions, regionCount, bumps);
  const rNeighbours = meetings.counts();
  const out: RegionStats[] = [];
  for (let id = 1; id < n; id++) {
    const a = area[id]!;
    if (a === 0) continue;
    compRegions[comp[id]!]!++;
    out.push({
      id,
      area: a,
      x: sx[id]! / a + 0.5,
      y: sy[id]! / a + 0.5,
      // The 8-bit encoding is linear, so the mean of the codes decodes to the mean colour.
      lab: lab8ToLab(sLab[3 * id]! / a, sLab[3 * id + 1]! / a, sLab[3 * id + 2]! / a),
      backgroundLab: lab8ToLab(sBg[3 * id]! / a, sBg[3 * id + 1]! / a, sBg[3 * id + 2]! / a),
      contrast: sDe[id]! / a,
      halfWidth: rHalf[id]!,
      peak: rPeak[id]!,
      steepest: rSteep[id]!,
      component: comp[id]!,
      bumps: rBumps[id]!,
      neighbours: rNeighbours[id]!,
    });
  }
  const cBumps = bumpsPer(components, componentCount, bumps);
  const comps: ComponentStats[] = [];
  for (let id = 1; id <= componentCount; id++) {
    comps.push({
      id,
      area: cArea[id]!,
      halfWidth: cHalf[id]!,
      regions: compRegions[id]!,
      rimPixels: cRim[id]!,
      meanDistance: cArea[id]! > 0 ? cDist[id]! / cArea[id]! : 0,
      ridgeVariation: trimmedVariation(cRidge[id]!),
      bumps: cBumps[id]!,
    });
  }
  return { regions: out, components: comps };
}

/**
 * Which regions 1..n meet: the watershed leaves a line of unlabelled pixels between two regions
 * that meet, so two labels among the 8 neighbours of an unlabelled foreground pixel are
 * neighbours. `note` is called from the measuring pass for each such pixel; unlabelled foreground
 * that only one region touches (the background's flood, split.ts) joins nothing. `counts` gives
 * how many others each region meets.
 */
function regionMeetings(regions: Mat, n: number) {
  const l = regions.data32S;
  const w = regions.cols;
  const h = regions.rows;
  const pairs = new Set<number>();
  const around = [-w - 1, -w, -w + 1, -1, 1, w - 1, w, w + 1];
  const seen: number[] = [];
  return {
    note(i: number): void {
      const x = i % w;
      if (x === 0 || x === w - 1 || i < w || i >= (h - 1) * w) return;
      seen.length = 0;
      for (const o of around) {
        const id = l[i + o]!;
        if (id > 0 && !seen.includes(id)) seen.push(id);
      }
      for (let a = 0; a < seen.length; a++)
        for (let b = a + 1; b < seen.length; b++)
          pairs.add(Math.min(seen[a]!, seen[b]!) * (n + 1) + Math.max(seen[a]!, seen[b]!));
    },
    counts(): Int32Array {
      const count = new Int32Array(n + 1);
      for (const key of pairs) {
        count[Math.floor(key / (n + 1))]!++;
        count[key % (n + 1)]!++;
      }
      return count;
    },
  };
}

/** How many of `bumps` are centred on each label 1..n of a label image. */
function bumpsPer(labels: Mat, n: number, bumps: readonly { x: number; y: number }[]): Int32Array {
  const count = new Int32Array(n + 1);
  const l = labels.data32S;
  for (const b of bumps) {
    const id = l[Math.round(b.y) * labels.cols + Math.round(b.x)] ?? 0;
    if (id > 0 && id <= n) count[id]!++;
  }
  return count;
}

/**
 * Coefficient of variation of a blob's ridge values, leaving out those above RIDGE_TRIM times
 * their median: a colony touching a pen line raises the line's ridge where it sits, and should not
 * make the line look uneven. Along a chain of colonies no value reaches 1.5 × the median (the
 * ridge follows √(R² − x²), whose median is 0.87 R), so little is left out there. 0 for a ridge
 * of fewer than two values.
 */
const RIDGE_TRIM = 1.3;
function trimmedVariation(values: number[]): number {
  if (values.length < 2) return 0;
  values.sort((a, b) => a - b);
  const limit = RIDGE_TRIM * values[values.length >> 1]!;
  let n = 0;
  let sum = 0;
  let sum2 = 0;
  for (const v of values) {
    if (v > limit) break;
    n++;
    sum += v;
    sum2 += v * v;
  }
  const mean = sum / n;
  return mean > 0 ? Math.sqrt(Math.max(0, sum2 / n - mean * mean)) / mean : 0;
}
