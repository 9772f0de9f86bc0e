import type { Blob } from './blob-seeds.ts';
import { SMALLEST_COLONY_RADIUS_MM } from './colony-size.ts';
import { dilateByDisc } from './disc-dilation.ts';
import type { WorkingFrame } from './frame.ts';
import { oddAtLeast } from './kernel-size.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import { PointGrid } from './point-grid.ts';

/**
 * Splits touching and slightly overlapping colonies: marker-controlled watershed (Beucher &
 * Meyer 1993) seeded at the peaks of the Euclidean distance transform of the foreground, the
 * usual recipe for touching round objects. Peaks are found at the scale of each colony (see
 * scaledPeaks), so that a pair overlapping down to 0.7× the sum of their radii still gets two
 * seeds while one big colony gets one.
 *
 * Output: `regions` (CV_32S, 1..n per colony candidate, 0 elsewhere), `components` (CV_32S, the
 * connected foreground blobs before splitting), `distance` (CV_32F), and the typical radius used.
 */
export interface Split {
  regions: Mat;
  regionCount: number;
  components: Mat;
  componentCount: number;
  distance: Mat;
  /** The distance map's ridge: pixels no 3×3 neighbour exceeds (8-bit 0/255; see candidates.ts). */
  ridge: Mat;
  typicalRadius: number;
}

/** Contrast blobs (blob-seeds.ts) and the ΔE they were found in, to seed what outlines miss. */
export interface BlobSeeding {
  blobs: readonly Blob[];
  deltaE: Mat;
}

export function splitTouching(
  cv: OpenCv,
  keep: Keep,
  rgb: Mat,
  mask: Mat,
  frame: WorkingFrame,
  seeding?: BlobSeeding,
): Split {
  const distance = keep(new cv.Mat());
  cv.distanceTransform(mask, distance, cv.DIST_L2, cv.DIST_MASK_5);
  const components = keep(new cv.Mat());
  const componentCount = cv.connectedComponents(mask, components, 8, cv.CV_32S) - 1;
  const thinnest = SMALLEST_COLONY_RADIUS_MM / frame.mmPerPx;
  const typicalRadius =
    typicalPeak(distance, components, componentCount, thinnest) || 0.6 / frame.mmPerPx;

  const regions = keep(new cv.Mat());
  const regionCount = withMats((k) => {
    const peaks = k(scaledPeaks(cv, distance));
    const floor = k(new cv.Mat());
    cv.threshold(distance, floor, Math.max(1.5, 0.3 * typicalRadius), 255, cv.THRESH_BINARY);
    const floor8 = k(new cv.Mat());
    floor.convertTo(floor8, cv.CV_8U);
    cv.bitwise_and(peaks, floor8, peaks);
    if (seeding) addBlobSeeds(cv, peaks, distance, seeding, components);
    const n = cv.connectedComponents(peaks, regions, 8, cv.CV_32S) - 1;

    // Watershed wants every pixel known to be background labelled too: outside a slightly grown mask.
    const grown = k(new cv.Mat());
    cv.dilate(mask, grown, k(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(5, 5))));
    const outside = k(new cv.Mat());
    cv.bitwise_not(grown, outside);
    regions.setTo([n + 1, 0, 0, 0], outside);
    cv.watershed(rgb, regions);
    // Background and the -1 ridge lines back to 0, so labels are exactly the colony regions.
    const bg = k(new cv.Mat());
    const level = k(new cv.Mat(regions.rows, regions.cols, cv.CV_32S, [n + 1, 0, 0, 0]));
    cv.compare(regions, level, bg, cv.CMP_EQ);
    regions.setTo([0, 0, 0, 0], bg);
    // The same plane, now all zeros: not a label, so ridges (-1) are what is not above it.
    level.setTo([0, 0, 0, 0]);
    cv.compare(regions, level, bg, cv.CMP_LE);
    regions.setTo([0, 0, 0, 0], bg);
    // Keep the watershed inside the foreground: it may flood a pixel or two past the mask edge.
    const notMask = k(new cv.Mat());
    cv.bitwise_not(mask, notMask);
    regions.setTo([0, 0, 0, 0], notMask);
    return n;
  });
  const ridge = keep(ridgeOf(cv, distance));
  return { regions, regionCount, components, componentCount, distance, ridge, typicalRadius };
}

/**
 * A contrast blob (blob-seeds.ts) that no distance-map seed accounts for is a colony the outline
 * did not separate, and gets a seed of its own: a disc of a third of its radius, where the blob
 * lies mostly inside the foreground (its centre at least INSIDE radii from the edge). A seed
 * accounts for a blob whose own disc holds the seed (the same colony seen smaller), or that lies
 * within the seed's inscribed disc with no dip in ΔE between them: there the blob is the colony's
 * own rim, highlight, halo or shaded side. A separate colony, however close, is a second dome, and
 * ΔE falls between the two: two domes have a saddle between them, one dome's flank does not.
 * A blob in a piece of foreground that has no seed at all seeds it at the blob's centre, whatever
 * its depth: a small faint colony of which only the middle clears the threshold has an outline
 * narrower than the seed floor and than the blob's own disc, and the background would flood it.
 * Nothing else is in that piece for the seed to be mistaken for.
 */
const INSIDE = 0.7;
function addBlobSeeds(
  cv: OpenCv,
  peaks: Mat,
  distance: Mat,
  seeding: BlobSeeding,
  components: Mat,
): void {
  const { blobs, deltaE } = seeding;
  const p = peaks.data;
  const d = distance.data32F;
  const w = peaks.cols;
  const component = components.data32S;
  const seeds = new PointGrid<{ x: number; y: number; r: number }>(8);
  const seeded = new Set<number>();
  let widest = 0;
  for (let i = 0; i < p.length; i++) {
    if (!p[i]) continue;
    seeds.add({ x: i % w, y: Math.floor(i / w), r: d[i]! });
    seeded.add(component[i]!);
    widest = Math.max(widest, d[i]!);
  }
  for (const b of blobs) {
    const x = Math.round(b.x);
    const y = Math.round(b.y);
    const own = component[y * w + x]!;
    if (own > 0 && !seeded.has(own)) {
      seeded.add(own);
      p[y * w + x] = 255;
      continue;
    }
    if (d[y * w + x]! < INSIDE * b.r) continue;
    const reach = Math.max(b.r, widest);
    const accounts = (s: { x: number; y: number; r: number }) => {
      const dist = Math.hypot(s.x - b.x, s.y - b.y);
      if (dist < b.r) return true;
      return dist < s.r && !dipBetween(deltaE, b, s);
    };
    if (seeds.some(b.x, b.y, reach, accounts)) continue;
    cv.circle(peaks, new cv.Point(x, y), Math.floor(b.r / 3), [255, 0, 0, 0], -1);
  }
}

/** ΔE must fall this share below the blob's centre on the way to a seed to count as a dip. */
const DIP = 0.2;
/** Whether ΔE falls on the way from the blob's centre to p by more than DIP of its value there. */
function dipBetween(
  deltaE: Mat,
  b: { x: number; y: number },
  p: { x: number; y: number },
): boolean {
  const v = deltaE.data32F;
  const w = deltaE.cols;
  const at = (x: number, y: number) => v[Math.round(y) * w + Math.round(x)]!;
  const start = at(b.x, b.y);
  const steps = Math.ceil(Math.hypot(p.x - b.x, p.y - b.y));
  for (let i = 1; i < steps; i++) {
    const t = i / steps;
    if (at(b.x + t * (p.x - b.x), b.y + t * (p.y - b.y)) < (1 - DIP) * start) return true;
  }
  return false;
}

/** Local maxima of the distance map (3×3), at least one pixel inside the foreground. */
function ridgeOf(cv: OpenCv, distance: Mat): Mat {
  return withMats((keep) => {
    const grown = keep(new cv.Mat());
    cv.dilate(distance, grown, keep(cv.getStructuringElement(cv.MORPH_RECT, new cv.Size(3, 3))));
    const ridge = new cv.Mat();
    cv.compare(distance, grown, ridge, cv.CMP_GE);
    const inside = keep(new cv.Mat());
    cv.threshold(distance, inside, 1, 255, cv.THRESH_BINARY);
    const inside8 = keep(new cv.Mat());
    inside.convertTo(inside8, cv.CV_8U);
    cv.bitwise_and(ridge, inside8, ridge);
    return ridge;
  });
}

/**
 * Pixels of the distance map that no higher value overshadows, where a value v overshadows the
 * disc of radius SEED_REACH·v round it: a big colony's centre suppresses the small bumps a ragged
 * outline gives its distance map, while two small touching colonies keep a seed each. The reach
 * depends on the value, so it is applied per octave of values: a max filter over the pixels of
 * each octave [v, 2v), of radius SEED_REACH·v, and a pixel survives if it beats them all.
 */
const SEED_REACH = 0.7;
function scaledPeaks(cv: OpenCv, distance: Mat): Mat {
  return withMats((keep) => {
    const peaks = new cv.Mat(distance.rows, distance.cols, cv.CV_8UC1, [255, 0, 0, 0]);
    const top = cv.minMaxLoc(distance).maxVal;
    // One pair of planes for every octave: a float plane each would add 5 MB per octave at 1.3 MP.
    const octave = keep(new cv.Mat());
    const beats = keep(new cv.Mat());
    for (let v = 1.5; v <= top; v *= 2) {
      cv.threshold(distance, octave, v, 0, cv.THRESH_TOZERO);
      dilateByDisc(cv, keep, octave, oddAtLeast(3, 2 * SEED_REACH * v));
      cv.compare(distance, octave, beats, cv.CMP_GE);
      cv.bitwise_and(peaks, beats, peaks);
    }
    return peaks;
  });
}

/**
 * Median over blobs of their largest distance-map value, i.e. the radius of the typical colony
 * (most blobs are single colonies). Only blobs at least `thinnest` thick vote: specks thinner than
 * any colony (noise and JPEG ringing that survived the opening) are no sample of the colonies'
 * size, and on a grainy photo they are the majority (on a half-resolution copy of a test photo
 * they made the typical radius half the colonies' own). One pass over the label image: opencv has
 * no per-label max.
 */
export function typicalPeak(distance: Mat, labels: Mat, n: number, thinnest: number): number {
  if (n === 0) return 0;
  const peak = new Float32Array(n + 1);
  const d = distance.data32F;
  const l = labels.data32S;
  for (let i = 0; i < l.length; i++) {
    const id = l[i]!;
    if (id > 0 && d[i]! > peak[id]!) peak[id] = d[i]!;
  }
  const values = Array.from(peak.subarray(1))
    .filter((v) => v >= thinnest)
    .sort((a, b) => a - b);
  return values.length ? values[values.length >> 1]! : 0;
}
