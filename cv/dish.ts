import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import type { Dish } from './types.ts';

/**
 * Finds the Petri dish in an upright photo.
 *
 * Input: an RGBA Mat at any resolution (it is reduced to a preview of PREVIEW_SIDE px first).
 * Output: the dish's outer wall as an ellipse in the input's pixels, or null when no dish-sized
 * circle is found. Method: circular Hough transform (HOUGH_GRADIENT, Yuen et al. 1990, as in
 * opencv) for a first circle, then an ellipse least-squares fit (Fitzgibbon's method, opencv
 * fitEllipse) to the strongest edge along rays from its centre, so a dish photographed at a
 * slight tilt is followed. Invariant to the dish's position and to uniform brightness changes.
 */
const PREVIEW_SIDE = 640;
const RAYS = 120;
/** Share of the outer radius that is agar the counting may use: the wall and a band inside it are excluded. */
export const AGAR_FRACTION = 0.93;

export function detectDish(cv: OpenCv, rgba: Mat): Dish | null {
  return withMats((keep) => {
    const scale = Math.min(1, PREVIEW_SIDE / Math.max(rgba.cols, rgba.rows));
    const small = keep(new cv.Mat());
    cv.resize(
      rgba,
      small,
      new cv.Size(Math.round(rgba.cols * scale), Math.round(rgba.rows * scale)),
      0,
      0,
      cv.INTER_AREA,
    );
    const gray = keep(new cv.Mat());
    cv.cvtColor(small, gray, cv.COLOR_RGBA2GRAY);
    cv.GaussianBlur(gray, gray, new cv.Size(5, 5), 1.5);

    const circle = houghDish(cv, keep, gray);
    if (!circle) return null;
    const ellipse = refineEllipse(cv, keep, gray, circle) ?? {
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
      cx: ellipse.cx * inv,
      cy: ellipse.cy * inv,
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
 * Walks RAYS rays outwards from the Hough centre and keeps, on each, the radius of the strongest
 * brightness step between 0.8 and 1.15 of the Hough radius; fits an ellipse to those points,
 * drops points more than 2.5 % of the radius off it and fits again.
 */
function refineEllipse(
  cv: OpenCv,
  keep: Keep,
  gray: Mat,
  c: { x: number; y: number; r: number },
): { cx: number; cy: number; rx: number; ry: number; angleDeg: number } | null {
  const gx = keep(new cv.Mat());
  const gy = keep(new cv.Mat());
  cv.Sobel(gray, gx, cv.CV_32F, 1, 0, 3);
  cv.Sobel(gray, gy, cv.CV_32F, 0, 1, 3);
  const mag = keep(new cv.Mat());
  cv.magnitude(gx, gy, mag);
  const m = mag.data32F;
  const w = mag.cols;
  const h = mag.rows;

  const points: [number, number][] = [];
  for (let i = 0; i < RAYS; i++) {
    const t = (2 * Math.PI * i) / RAYS;
    const dx = Math.cos(t);
    const dy = Math.sin(t);
    let best = -1;
    let bestR = 0;
    for (let rr = c.r * 0.8; rr <= c.r * 1.15; rr += 0.5) {
      const x = Math.round(c.x + dx * rr);
      const y = Math.round(c.y + dy * rr);
      if (x < 0 || y < 0 || x >= w || y >= h) break;
      const v = m[y * w + x]!;
      if (v > best) {
        best = v;
        bestR = rr;
      }
    }
    if (best > 0) points.push([c.x + dx * bestR, c.y + dy * bestR]);
  }
  let fit = fitEllipseTo(cv, keep, points);
  if (!fit) return null;
  const tolerance = 0.025 * c.r;
  const inliers = points.filter((p) => ellipseResidual(fit!, p) < tolerance);
  if (inliers.length >= RAYS * 0.5) fit = fitEllipseTo(cv, keep, inliers) ?? fit;
  // A fit that wandered far from the Hough circle latched onto something else (a shadow, the bench edge).
  const meanR = (fit.rx + fit.ry) / 2;
  if (
    Math.abs(meanR - c.r) > 0.15 * c.r ||
    Math.min(fit.rx, fit.ry) / Math.max(fit.rx, fit.ry) < 0.75
  ) {
    return null;
  }
  return fit;
}

function fitEllipseTo(
  cv: OpenCv,
  keep: Keep,
  points: [number, number][],
): { cx: number; cy: number; rx: number; ry: number; angleDeg: number } | null {
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

/** Distance of a point from the ellipse boundary, measured along its ray from the centre. */
export function ellipseResidual(
  e: { cx: number; cy: number; rx: number; ry: number; angleDeg: number },
  [x, y]: [number, number],
): number {
  const a = (e.angleDeg * Math.PI) / 180;
  const dx = x - e.cx;
  const dy = y - e.cy;
  const u = dx * Math.cos(a) + dy * Math.sin(a);
  const v = -dx * Math.sin(a) + dy * Math.cos(a);
  const dist = Math.hypot(u, v);
  if (dist === 0) return Math.min(e.rx, e.ry);
  const boundary = 1 / Math.sqrt((u / dist / e.rx) ** 2 + (v / dist / e.ry) ** 2);
  return Math.abs(dist - boundary);
}

/** Normalised radius of a point in the ellipse (1 on the boundary). */
export function ellipseRadius(
  e: { cx: number; cy: number; rx: number; ry: number; angleDeg: number },
  x: number,
  y: number,
): number {
  const a = (e.angleDeg * Math.PI) / 180;
  const dx = x - e.cx;
  const dy = y - e.cy;
  const u = dx * Math.cos(a) + dy * Math.sin(a);
  const v = -dx * Math.sin(a) + dy * Math.cos(a);
  return Math.sqrt((u / e.rx) ** 2 + (v / e.ry) ** 2);
}
