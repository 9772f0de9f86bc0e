import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import type { Dish } from './types.ts';

/**
 * The agar's colour next to the dish wall, where the 9 mm median background (agar.ts) cannot
 * follow the light. The meniscus, where the agar climbs the wall, and the wall's reflections make
 * rings of light and shade a millimetre or two wide that run round the whole dish; a median that
 * wide averages them away, so bare agar there stands several ΔE off its background (the median ΔE
 * of bare agar within 0.6 mm of the wall is three to seven times its level mid-plate on phone
 * photos), and the threshold finds the rings' pieces as colonies.
 *
 * The rings vary steeply across the wall and slowly along it. So the band within BAND_MM of the
 * wall is unrolled into a strip, one row per pixel of depth and one column per pixel of wall
 * length (a resampling along rays from the dish's centre, the usual polar unwrapping of a round
 * object), and each row is summarised by medians over WINDOW_MM of wall, every STEP_MM. A colony
 * is far shorter than the window and drops out of its median, as out of the 9 mm one.
 *
 * Writing along the rim can fill half a window at its own depth, and its median then takes the
 * ink's colour. Such a window is an outlier among the row's windows round the dish, which all
 * see the same ring: a window whose median departs from the row's median window by more than
 * OUTLIER_SDS robust standard deviations (1.4826 × the median absolute deviation, the Hampel
 * identifier; Davies & Gather 1993, cited from memory) in any Lab plane is replaced by its
 * typical neighbours. The medians, interpolated along the wall, are read back into the band and
 * blended into the median background over the band's inner BLEND_MM.
 */
const BAND_MM = 3;
const BLEND_MM = 1;
const WINDOW_MM = 10;
const STEP_MM = 2.5;
const OUTLIER_SDS = 3;
/** The least departure (8-bit Lab units) counted as an outlier: the planes' own quantisation. */
const OUTLIER_FLOOR = 2;

type DishEllipse = Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry' | 'angleDeg' | 'agarFraction'>;

/** Replaces `background8` (8-bit Lab) within BAND_MM of the agar's edge by the wall's rings. */
export function followWall(
  cv: OpenCv,
  lab8: Mat,
  background8: Mat,
  dish: DishEllipse,
  mmPerPx: number,
): void {
  const e = agarEllipse(dish);
  const band: Band = {
    depth: Math.max(2, Math.ceil(BAND_MM / mmPerPx)),
    columns: Math.max(8, Math.round(2 * Math.PI * Math.sqrt((e.rx ** 2 + e.ry ** 2) / 2))),
  };
  withMats((keep) => {
    const strip = keep(unroll(cv, keep, lab8, e, band));
    const window = Math.max(3, Math.round(WINDOW_MM / mmPerPx));
    const windows = Math.max(3, Math.round((band.columns * mmPerPx) / STEP_MM));
    const rings = ringMedians(strip.data, band, window, windows);
    rollBack(rings, windows, background8, e, band.depth, BLEND_MM / mmPerPx);
  });
}

interface Band {
  /** Rows of the strip: pixels of depth in from the wall. */
  depth: number;
  /** Columns of the strip: pixels of wall length, once round. */
  columns: number;
}

interface AgarEllipse {
  cos: number;
  sin: number;
  cx: number;
  cy: number;
  rx: number;
  ry: number;
}

function agarEllipse(d: DishEllipse): AgarEllipse {
  const a = (d.angleDeg * Math.PI) / 180;
  return {
    cos: Math.cos(a),
    sin: Math.sin(a),
    cx: d.cx,
    cy: d.cy,
    rx: d.rx * d.agarFraction,
    ry: d.ry * d.agarFraction,
  };
}

/** The band as a strip (8-bit, 3 channels): row i lies i + ½ pixels in from the wall. */
function unroll(cv: OpenCv, keep: Keep, lab8: Mat, e: AgarEllipse, { depth, columns }: Band): Mat {
  const mapX = keep(new cv.Mat(depth, columns, cv.CV_32F));
  const mapY = keep(new cv.Mat(depth, columns, cv.CV_32F));
  const mx = mapX.data32F;
  const my = mapY.data32F;
  for (let j = 0; j < columns; j++) {
    const t = (2 * Math.PI * j) / columns;
    const u = e.rx * Math.cos(t);
    const v = e.ry * Math.sin(t);
    const edge = Math.hypot(u, v);
    for (let i = 0; i < depth; i++) {
      const k = Math.max(0, 1 - (i + 0.5) / edge);
      mx[i * columns + j] = e.cx + k * (u * e.cos - v * e.sin);
      my[i * columns + j] = e.cy + k * (u * e.sin + v * e.cos);
    }
  }
  const strip = new cv.Mat();
  cv.remap(lab8, strip, mapX, mapY, cv.INTER_LINEAR, cv.BORDER_REPLICATE);
  return strip;
}

/**
 * Per row and Lab plane, the median of `windows` evenly spaced windows of `window` columns round
 * the strip (it wraps), outliers among them replaced (see above): rows × windows × 3 values.
 */
function ringMedians(
  strip: Uint8Array,
  { depth, columns }: Band,
  window: number,
  windows: number,
): Uint8Array {
  const out = new Uint8Array(depth * windows * 3);
  const histogram = new Int32Array(256);
  const half = Math.floor(Math.min(window, columns) / 2);
  const row = new Uint8Array(windows);
  for (let i = 0; i < depth; i++) {
    for (let ch = 0; ch < 3; ch++) {
      for (let k = 0; k < windows; k++) {
        const centre = Math.round((k * columns) / windows);
        histogram.fill(0);
        for (let j = centre - half; j <= centre + half; j++) {
          const c = ((j % columns) + columns) % columns;
          histogram[strip[(i * columns + c) * 3 + ch]!]!++;
        }
        row[k] = medianOf(histogram, 2 * half + 1);
      }
      replaceOutliers(row);
      for (let k = 0; k < windows; k++) out[(i * windows + k) * 3 + ch] = row[k]!;
    }
  }
  return out;
}

/** The median of `count` 8-bit values given as a histogram. */
function medianOf(histogram: Int32Array, count: number): number {
  let rest = count >> 1;
  let v = 0;
  while (rest >= histogram[v]!) rest -= histogram[v++]!;
  return v;
}

/** Windows far from the row's median window (see above) take their typical neighbours' value. */
function replaceOutliers(row: Uint8Array): void {
  const n = row.length;
  const median = sortedMedian(Array.from(row));
  const spread = 1.4826 * sortedMedian(Array.from(row, (v) => Math.abs(v - median)));
  const limit = Math.max(OUTLIER_SDS * spread, OUTLIER_FLOOR);
  const typical = [...row.keys()].filter((k) => Math.abs(row[k]! - median) <= limit);
  if (typical.length === n) return;
  if (typical.length === 0) {
    row.fill(median);
    return;
  }
  const source = Uint8Array.from(row);
  for (let k = 0; k < n; k++) {
    if (Math.abs(source[k]! - median) <= limit) continue;
    // The nearest typical windows on either side, round the ring.
    const after = typical.find((t) => t > k) ?? typical[0]! + n;
    let before = typical[typical.length - 1]! - n;
    for (const t of typical) if (t < k) before = t;
    const f = (k - before) / (after - before);
    row[k] = Math.round(source[(before + n) % n]! * (1 - f) + source[after % n]! * f);
  }
}

function sortedMedian(values: number[]): number {
  values.sort((a, b) => a - b);
  return values[values.length >> 1]!;
}

/**
 * Writes the ring medians back into the band of `background8`: each band pixel takes them at its
 * own depth and angle (bilinear, round the ring), blended with the median background over the
 * band's inner `blend` pixels. opencv.js has no inverse polar map for an ellipse, so this is a
 * loop over the band's pixels, row by row between the ellipse and the band's inner ellipse.
 */
function rollBack(
  rings: Uint8Array,
  windows: number,
  background8: Mat,
  e: AgarEllipse,
  depth: number,
  blend: number,
): void {
  const b = background8.data;
  const cols = background8.cols;
  const outer = Math.max(e.rx, e.ry);
  const innerRho = Math.max(0, 1 - depth / Math.min(e.rx, e.ry));
  const y0 = Math.max(0, Math.floor(e.cy - outer));
  const y1 = Math.min(background8.rows - 1, Math.ceil(e.cy + outer));
  const pixel = (x: number, y: number) => {
    const dx = x - e.cx;
    const dy = y - e.cy;
    const u = (dx * e.cos + dy * e.sin) / e.rx;
    const v = (-dx * e.sin + dy * e.cos) / e.ry;
    const rho = Math.sqrt(u * u + v * v);
    if (rho > 1 || rho === 0) return;
    const edge = Math.sqrt((u * e.rx) ** 2 + (v * e.ry) ** 2) / rho;
    const i = (1 - rho) * edge - 0.5;
    if (i >= depth - 1) return;
    const t = Math.atan2(v, u);
    const k = ((t < 0 ? t + 2 * Math.PI : t) / (2 * Math.PI)) * windows;
    const weight = Math.min(1, (depth - 1 - i) / blend);
    blendSample(rings, windows, Math.max(0, i), k, b, (y * cols + x) * 3, weight);
  };
  for (let y = y0; y <= y1; y++) {
    const span = rowSpan(e, y - e.cy, 1);
    if (!span) continue;
    const hole = rowSpan(e, y - e.cy, innerRho);
    const from = Math.max(0, Math.floor(span[0]));
    const to = Math.min(cols - 1, Math.ceil(span[1]));
    const holeFrom = hole ? Math.ceil(hole[0]) + 1 : to + 1;
    const holeTo = hole ? Math.floor(hole[1]) - 1 : to;
    for (let x = from; x < Math.min(holeFrom, to + 1); x++) pixel(x, y);
    for (let x = Math.max(holeTo + 1, from); x <= to; x++) pixel(x, y);
  }
}

/**
 * Where row `dy` (from the centre) crosses the ellipse scaled by `rho`: the x interval (image
 * columns) from the quadratic (u/rx)² + (v/ry)² = rho², or null if it misses.
 */
function rowSpan(e: AgarEllipse, dy: number, rho: number): [number, number] | null {
  const a = e.cos ** 2 / e.rx ** 2 + e.sin ** 2 / e.ry ** 2;
  const b = 2 * dy * e.cos * e.sin * (1 / e.rx ** 2 - 1 / e.ry ** 2);
  const c = dy ** 2 * (e.sin ** 2 / e.rx ** 2 + e.cos ** 2 / e.ry ** 2) - rho ** 2;
  const disc = b * b - 4 * a * c;
  if (disc < 0) return null;
  const root = Math.sqrt(disc);
  return [e.cx + (-b - root) / (2 * a), e.cx + (-b + root) / (2 * a)];
}

/** Blends the bilinear sample of `rings` at (row i, window k, wrapping) into pixel `at`. */
function blendSample(
  rings: Uint8Array,
  windows: number,
  i: number,
  k: number,
  b: Uint8Array,
  at: number,
  weight: number,
): void {
  const i0 = Math.floor(i);
  const k0 = Math.floor(k) % windows;
  const k1 = (k0 + 1) % windows;
  const fi = i - i0;
  const fk = k - Math.floor(k);
  const r0 = i0 * windows;
  const r1 = r0 + windows;
  for (let ch = 0; ch < 3; ch++) {
    const top = rings[(r0 + k0) * 3 + ch]! * (1 - fk) + rings[(r0 + k1) * 3 + ch]! * fk;
    const bottom = rings[(r1 + k0) * 3 + ch]! * (1 - fk) + rings[(r1 + k1) * 3 + ch]! * fk;
    const value = top * (1 - fi) + bottom * fi;
    b[at + ch] = Math.round(b[at + ch]! * (1 - weight) + value * weight);
  }
}
