import { SMALLEST_COLONY_RADIUS_MM } from './colony-size.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import { PointGrid } from './point-grid.ts';

/**
 * Colony centres found by their contrast rather than their outline: the maxima of the
 * scale-normalised Laplacian of Gaussian of ΔE (Lindeberg 1998, "Feature detection with automatic
 * scale selection"). A colony is a bump in ΔE whatever its hue or whether it is lighter or darker
 * than the agar, and the bump's centre is a maximum of −σ²∇²(G_σ ∗ ΔE) at σ ≈ r/√2. Where colonies
 * of different strength touch, the foreground's outline has no neck between them and its distance
 * map no second peak, yet each still has its own bump.
 *
 * A maximum counts when it clears BLOB_NOISE_MULTIPLE standard deviations of the same response
 * over the plate's bare agar, so the level follows each photo's noise and texture. Scales run an
 * octave apart (a colony's response is broad in scale: halfway between two octaves it still has
 * about nine-tenths of its peak), each on the image halved once more, so the whole search costs
 * little more than its first scale.
 *
 * Output: blobs in working pixels (r = √2σ), strongest first, none close to a stronger one's
 * centre.
 */
export interface Blob {
  x: number;
  y: number;
  r: number;
  response: number;
}

/**
 * Largest colony radius looked for (mm; the smallest is SMALLEST_COLONY_RADIUS_MM): colonies up
 * to 3 mm across. Larger colonies are seldom packed unseparated: their outlines' necks give the
 * distance map a seed each.
 */
const LARGEST_R_MM = 1.5;
const BLOB_NOISE_MULTIPLE = 3;
/** σ in a level's own pixels at most this: beyond it the next, halved level serves. */
const OCTAVE_SIGMA = 3;
/**
 * A blob whose centre lies within this many radii of a stronger one is part of it: a colony's
 * shaded side and halo reach about a third of its radius past its edge.
 */
const SAME_COLONY = 1.3;
/**
 * The smallest σ looked at, in pixels: narrower, the 3-point second difference misreads the
 * Laplacian of a Gaussian sampled by so few pixels, and its maxima were pieces of colonies.
 */
const SMALLEST_SIGMA_PX = 2;
/** Fewer bare agar pixels than this give no usable noise level. */
const MIN_BARE_PIXELS = 100;

export function contrastBlobs(
  cv: OpenCv,
  deltaE: Mat,
  agar: Mat,
  foreground: Mat,
  mmPerPx: number,
): Blob[] {
  return withMats((keep) => {
    const bare = keep(new cv.Mat());
    cv.subtract(agar, foreground, bare);
    // No bare agar to measure the noise against (a plate grown over): no level to clear.
    if (cv.countNonZero(bare) < MIN_BARE_PIXELS) return [];
    const found: Blob[] = [];
    let level = { image: deltaE, bare, fg: foreground, factor: 1 };
    const smallest = Math.max(SMALLEST_SIGMA_PX, SMALLEST_COLONY_RADIUS_MM / Math.SQRT2 / mmPerPx);
    const largest = LARGEST_R_MM / Math.SQRT2 / mmPerPx;
    for (let sigma = smallest; sigma <= largest; sigma *= 2) {
      while (sigma / level.factor > OCTAVE_SIGMA) level = halved(cv, keep, level);
      const at = level;
      found.push(...withMats((k) => maximaAtScale(cv, k, at, sigma)));
    }
    return suppressed(found);
  });
}

interface Level {
  image: Mat;
  bare: Mat;
  fg: Mat;
  /** Working pixels per level pixel. */
  factor: number;
}

function halved(cv: OpenCv, keep: Keep, l: Level): Level {
  const size = new cv.Size(Math.max(1, l.image.cols >> 1), Math.max(1, l.image.rows >> 1));
  const image = keep(new cv.Mat());
  cv.resize(l.image, image, size, 0, 0, cv.INTER_AREA);
  const bare = keep(new cv.Mat());
  cv.resize(l.bare, bare, size, 0, 0, cv.INTER_NEAREST);
  const fg = keep(new cv.Mat());
  cv.resize(l.fg, fg, size, 0, 0, cv.INTER_NEAREST);
  return { image, bare, fg, factor: l.factor * 2 };
}

function maximaAtScale(cv: OpenCv, keep: Keep, l: Level, sigma: number): Blob[] {
  const s = sigma / l.factor;
  const smooth = keep(new cv.Mat());
  cv.GaussianBlur(l.image, smooth, new cv.Size(0, 0), s);
  const response = keep(new cv.Mat());
  cv.Laplacian(smooth, response, cv.CV_32F, 1);
  // −σ²∇²: the scale-normalised response, positive on a bump (in level pixels, which is the same
  // number as in working pixels: σ² and ∇² scale inversely).
  response.convertTo(response, cv.CV_32F, -s * s);
  const mean = keep(new cv.Mat());
  const std = keep(new cv.Mat());
  cv.meanStdDev(response, mean, std, l.bare);
  const floor = mean.data64F[0]! + BLOB_NOISE_MULTIPLE * std.data64F[0]!;
  const at = (i: number) => ({
    x: ((i % l.image.cols) + 0.5) * l.factor - 0.5,
    y: (Math.floor(i / l.image.cols) + 0.5) * l.factor - 0.5,
    r: Math.SQRT2 * sigma,
    response: response.data32F[i]!,
  });
  return localMaxima(response, l.fg, floor)
    .filter((i) => roundBump(smooth, i))
    .map(at);
}

/**
 * Pixels inside the foreground above `floor` that no 8-neighbour exceeds. One pass in JavaScript
 * over the foreground's pixels: the opencv equivalent (a float dilation, a comparison, a
 * threshold and a labelling) costs several full-image passes.
 */
function localMaxima(response: Mat, fg: Mat, floor: number): number[] {
  const v = response.data32F;
  const m = fg.data;
  const w = response.cols;
  const found: number[] = [];
  for (let y = 1; y < response.rows - 1; y++) {
    for (let i = y * w + 1; i < (y + 1) * w - 1; i++) {
      const c = v[i]!;
      if (!m[i] || c <= floor) continue;
      if (c < v[i - 1]! || c < v[i + 1]! || c < v[i - w]! || c < v[i + w]!) continue;
      if (c < v[i - w - 1]! || c < v[i - w + 1]! || c < v[i + w - 1]! || c < v[i + w + 1]!)
        continue;
      found.push(i);
    }
  }
  return found;
}

/**
 * Whether the smoothed ΔE is a round bump here rather than a ridge: the ratio of the Hessian's
 * principal curvatures is below EDGE_RATIO, tested as Tr²/Det < (ρ+1)²/ρ (Lowe 2004, "Distinctive
 * image features from scale-invariant keypoints", §4.1, which uses ρ = 10 to drop edges). A
 * colony's bump is round; the shaded crescent beside a colony, the halo's ring and a stroke are
 * ridges. ρ = 2 still passes an ellipse of axes about 1.4:1 (curvatures scale as the axes²).
 */
const EDGE_RATIO = 2;
function roundBump(smooth: Mat, i: number): boolean {
  const w = smooth.cols;
  const v = smooth.data32F;
  const at = (dx: number, dy: number) => v[i + dy * w + dx]!;
  const dxx = at(1, 0) + at(-1, 0) - 2 * at(0, 0);
  const dyy = at(0, 1) + at(0, -1) - 2 * at(0, 0);
  const dxy = (at(1, 1) + at(-1, -1) - at(1, -1) - at(-1, 1)) / 4;
  const det = dxx * dyy - dxy * dxy;
  const tr = dxx + dyy;
  return det > 0 && (tr * tr) / det < (EDGE_RATIO + 1) ** 2 / EDGE_RATIO;
}

/** Strongest first; a blob near a stronger one's centre (SAME_COLONY radii of either) goes. */
function suppressed(blobs: Blob[]): Blob[] {
  const kept = new PointGrid<Blob>(8);
  let largest = 0;
  const out: Blob[] = [];
  for (const b of [...blobs].sort((p, q) => q.response - p.response)) {
    const reach = SAME_COLONY * Math.max(b.r, largest);
    const near = kept.some(b.x, b.y, reach, (k) => {
      return Math.hypot(k.x - b.x, k.y - b.y) < SAME_COLONY * Math.max(k.r, b.r);
    });
    if (near) continue;
    kept.add(b);
    out.push(b);
    largest = Math.max(largest, b.r);
  }
  return out;
}
