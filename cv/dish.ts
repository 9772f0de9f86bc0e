import { resizeRegion, steppedScale } from './banded-resize.ts';
import { deltaE76 } from './colour.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import type { Dish, RgbaImage } from './types.ts';

/**
 * Finds the Petri dish in an upright photo.
 *
 * Input: an upright RGBA photo at any resolution (it is reduced to a preview of about PREVIEW_SIDE
 * px first, band by band: see banded-resize.ts).
 * Output: the dish's outer wall as an ellipse in the input's pixels, or null when no dish-sized
 * circle is found. Method: circular Hough transform (HOUGH_GRADIENT, Yuen et al. 1990, as in
 * opencv) for a first circle, then an ellipse least-squares fit (Fitzgibbon's method, opencv
 * fitEllipse) to the strongest edge along rays from its centre, so a dish photographed at a
 * slight tilt is followed. Invariant to the dish's position and to uniform brightness changes.
 */
const PREVIEW_SIDE = 640;
const RAYS = 120;
/**
 * Share of the agar radius where colonies are counted. The edge found is the agar's own (the
 * wall starts there), so the whole agar counts; what the wall throws onto the agar next to it
 * (glints, the wall's inner face, crumbs) is rejected by the wall-zone rules in candidates.ts,
 * which keep a colony growing against the wall.
 */
export const AGAR_FRACTION = 1;
/** The agar's diameter when none is given: the common 90 mm Petri dish (common practice). */
export const DEFAULT_DISH_MM = 90;

/**
 * `dishDiameterMm`, the agar's diameter, sets how far along a ray the walk must see the edge hold
 * before it takes it (EDGE_RUN_MM in that dish's pixels).
 */
export function detectDish(
  cv: OpenCv,
  image: RgbaImage,
  dishDiameterMm = DEFAULT_DISH_MM,
): Dish | null {
  return withMats((keep) => {
    const scale = steppedScale(PREVIEW_SIDE / Math.max(image.width, image.height));
    const whole = { x: 0, y: 0, width: image.width, height: image.height };
    const small = keep(
      resizeRegion(
        cv,
        image,
        whole,
        scale,
        Math.round(image.width * scale),
        Math.round(image.height * scale),
      ),
    );
    const gray = keep(new cv.Mat());
    cv.cvtColor(small, gray, cv.COLOR_RGBA2GRAY);
    cv.GaussianBlur(gray, gray, new cv.Size(5, 5), 1.5);

    const circle = houghDish(cv, keep, gray);
    if (!circle) return null;
    const ellipse = refineEllipse(cv, keep, small, circle, dishDiameterMm) ?? {
      cx: circle.x,
      cy: circle.y,
      rx: circle.r,
      ry: circle.r,
      angleDeg: 0,
    };
    const inv = 1 / scale;
    const rx = ellipse.rx * inv;
    const ry = ellipse.ry * inv;
    return {
      // Preview pixel i covers [i, i+1): its centre is i + 0.5 in the continuous frame.
      cx: (ellipse.cx + 0.5) * inv,
      cy: (ellipse.cy + 0.5) * inv,
      rx,
      ry,
      angleDeg: ellipse.angleDeg,
      r: (rx + ry) / 2,
      agarFraction: AGAR_FRACTION,
      source: 'detected',
    };
  });
}

/** Completes a caller-given dish position into a Dish. */
export function givenDish(d: Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry' | 'angleDeg'>): Dish {
  return { ...d, r: (d.rx + d.ry) / 2, agarFraction: AGAR_FRACTION, source: 'given' };
}

function houghDish(cv: OpenCv, keep: Keep, gray: Mat): { x: number; y: number; r: number } | null {
  const side = Math.min(gray.cols, gray.rows);
  const circles = keep(new cv.Mat());
  // Large accumulator cells (dp 2) and one circle per image (minDist = side): a dish dominates the photo.
  cv.HoughCircles(
    gray,
    circles,
    cv.HOUGH_GRADIENT,
    2,
    side,
    80,
    40,
    Math.round(side * 0.25),
    Math.round(side * 0.56),
  );
  if (circles.cols === 0) return null;
  const d = circles.data32F;
  return { x: d[0]!, y: d[1]!, r: d[2]! };
}

/**
 * Walks RAYS rays outwards from a centre. On each, the agar's own colour is the median of the
 * samples between 0.55 and 0.75 of the expected radius; the agar edge is the first point beyond
 * that where the colour leaves it by more than EDGE_DELTA_E and stays away for most of the next
 * EDGE_RUN_MM (longer than any colony, so a colony on the ray does not stop the walk, while the
 * wall and the bench beyond it do). An ellipse is fitted to those points; points whose residual is over 2.5 times the
 * median residual are dropped (rays that still ended on a clump or a glint) and it is fitted again.
 * The walk is repeated from the fitted centre, because Hough's circle centre is off for a dish
 * seen at a tilt, and rays that cross the edge obliquely place it badly.
 */
const EDGE_DELTA_E = 12;
/**
 * How far out a ray walks, as a share of the first circle's radius. Hough's circle can be a fifth
 * of its radius off where glare and writing break the rim (on one plates-dev photo, 17 % off
 * centre and 11 % small): the far side's edge then lies beyond 1.3 radii, and an ellipse fitted
 * to the rays that stopped on the glare instead cut a third of the agar away.
 */
const WALK_END = 1.5;
const EDGE_RUN_MM = 5;
const EDGE_SUSTAIN = 0.6;

type Ellipse = { cx: number; cy: number; rx: number; ry: number; angleDeg: number };

function refineEllipse(
  cv: OpenCv,
  keep: Keep,
  rgba: Mat,
  c: { x: number; y: number; r: number },
  dishDiameterMm: number,
): Ellipse | null {
  const rgb = keep(new cv.Mat());
  cv.cvtColor(rgba, rgb, cv.COLOR_RGBA2RGB);
  cv.GaussianBlur(rgb, rgb, new cv.Size(5, 5), 1.2);
  const lab = keep(new cv.Mat());
  cv.cvtColor(rgb, lab, cv.COLOR_RGB2Lab);
  let centre = { x: c.x, y: c.y };
  let radius = c.r;
  let fit: Ellipse | null = null;
  for (let pass = 0; pass < 3; pass++) {
    const points = edgePoints(lab, centre, radius, dishDiameterMm);
    const next = robustEllipse(cv, keep, points);
    if (!next) break;
    fit = next;
    centre = { x: next.cx, y: next.cy };
    radius = (next.rx + next.ry) / 2;
  }
  if (!fit) return null;
  // A fit that wandered far from the Hough circle latched onto something else (a shadow, the bench edge).
  const meanR = (fit.rx + fit.ry) / 2;
  if (
    Math.abs(meanR - c.r) > 0.25 * c.r ||
    Math.min(fit.rx, fit.ry) / Math.max(fit.rx, fit.ry) < 0.75
  ) {
    return null;
  }
  return fit;
}

function edgePoints(
  lab: Mat,
  c: { x: number; y: number },
  radius: number,
  dishDiameterMm: number,
): [number, number][] {
  const d = lab.data;
  const w = lab.cols;
  const h = lab.rows;
  // 8-bit Lab: L* scaled by 255/100, a* and b* offset by 128.
  const at = (x: number, y: number): [number, number, number] | null => {
    const xi = Math.round(x);
    const yi = Math.round(y);
    if (xi < 0 || yi < 0 || xi >= w || yi >= h) return null;
    const i = 3 * (yi * w + xi);
    return [(d[i]! * 100) / 255, d[i + 1]! - 128, d[i + 2]! - 128];
  };
  const step = 0.5;
  const runSamples = Math.max(3, Math.round((EDGE_RUN_MM * radius) / (dishDiameterMm / 2) / step));
  const points: [number, number][] = [];
  for (let i = 0; i < RAYS; i++) {
    const t = (2 * Math.PI * i) / RAYS;
    const dx = Math.cos(t);
    const dy = Math.sin(t);
    const inner: [number, number, number][] = [];
    for (let rr = radius * 0.55; rr <= radius * 0.75; rr += step) {
      const v = at(c.x + dx * rr, c.y + dy * rr);
      if (v) inner.push(v);
    }
    if (inner.length < 5) continue;
    const ref = [0, 1, 2].map((k) => median(inner.map((v) => v[k]!)));
    const away: boolean[] = [];
    for (let rr = radius * 0.75; rr <= radius * WALK_END; rr += step) {
      const v = at(c.x + dx * rr, c.y + dy * rr);
      if (!v) break;
      away.push(deltaE76(v, [ref[0]!, ref[1]!, ref[2]!]) > EDGE_DELTA_E);
    }
    const k = firstSustained(away, runSamples);
    if (k >= 0) {
      const edge = radius * 0.75 + k * step;
      points.push([c.x + dx * edge, c.y + dy * edge]);
    }
  }
  return points;
}

/**
 * Index of the first sample that starts a window of `run` samples at least EDGE_SUSTAIN of which
 * are away from the agar colour: a colony (at most about 2.5 mm) fills less than half the window,
 * while the wall and bench fill most of it even where a band of the wall matches the agar.
 */
function firstSustained(away: boolean[], run: number): number {
  const need = Math.ceil(EDGE_SUSTAIN * run);
  let inWindow = 0;
  for (let i = 0; i < away.length; i++) {
    if (away[i]) inWindow++;
    if (i >= run && away[i - run]) inWindow--;
    const start = i - run + 1;
    if (start >= 0 && away[start] && inWindow >= need) return start;
  }
  return -1;
}

function robustEllipse(cv: OpenCv, keep: Keep, points: [number, number][]): Ellipse | null {
  let fit = fitEllipseTo(cv, keep, points);
  for (let pass = 0; fit && pass < 2; pass++) {
    const e = fit;
    const residuals = points.map((p) => ellipseResidual(e, p));
    const limit = Math.max(1, 2.5 * median(residuals));
    const inliers = points.filter((_, i) => residuals[i]! <= limit);
    if (inliers.length < RAYS * 0.4) break;
    fit = fitEllipseTo(cv, keep, inliers) ?? fit;
  }
  return fit;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[s.length >> 1]!;
}

function fitEllipseTo(cv: OpenCv, keep: Keep, points: [number, number][]): Ellipse | null {
  if (points.length < 6) return null;
  const mat = keep(cv.matFromArray(points.length, 1, cv.CV_32FC2, points.flat()));
  const box = cv.fitEllipse(mat);
  return {
    cx: box.center.x,
    cy: box.center.y,
    rx: box.size.width / 2,
    ry: box.size.height / 2,
    angleDeg: box.angle,
  };
}

/** A point in the ellipse's own frame: u along rx, v along ry, origin at the centre. */
function ellipseFrame(e: Ellipse, x: number, y: number): [number, number] {
  const a = (e.angleDeg * Math.PI) / 180;
  const dx = x - e.cx;
  const dy = y - e.cy;
  return [dx * Math.cos(a) + dy * Math.sin(a), -dx * Math.sin(a) + dy * Math.cos(a)];
}

/** Distance of a point from the ellipse boundary, measured along its ray from the centre. */
export function ellipseResidual(e: Ellipse, [x, y]: [number, number]): number {
  const [u, v] = ellipseFrame(e, x, y);
  const dist = Math.hypot(u, v);
  if (dist === 0) return Math.min(e.rx, e.ry);
  const boundary = 1 / Math.sqrt((u / dist / e.rx) ** 2 + (v / dist / e.ry) ** 2);
  return Math.abs(dist - boundary);
}

/** Normalised radius of a point in the ellipse (1 on the boundary). */
export function ellipseRadius(e: Ellipse, x: number, y: number): number {
  const [u, v] = ellipseFrame(e, x, y);
  return Math.sqrt((u / e.rx) ** 2 + (v / e.ry) ** 2);
}
