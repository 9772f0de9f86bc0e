import type { Keep } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';

/**
 * Focus, judged by colony edges. A step of height C blurred by a Gaussian of σ has a steepest
 * slope of C / (σ·√(2π)), so C divided by the steepest slope is an edge width, 2.5·σ, whatever the
 * colony's colour or contrast. Each colony gives one: its peak ΔE from the agar over the steepest
 * ΔE slope inside it (the edge of a dome is its steepest part). The plate's edge width is the
 * median over its colonies, in millimetres.
 */

/** |∇ΔE| in ΔE per working pixel (CV_32F). Sobel's 3×3 kernel weighs the difference by 8. */
export function deltaESlope(cv: OpenCv, keep: Keep, deltaE: Mat): Mat {
  const gx = keep(new cv.Mat());
  const gy = keep(new cv.Mat());
  cv.Sobel(deltaE, gx, cv.CV_32F, 1, 0, 3);
  cv.Sobel(deltaE, gy, cv.CV_32F, 0, 1, 3);
  const slope = keep(new cv.Mat());
  cv.magnitude(gx, gy, slope);
  slope.convertTo(slope, cv.CV_32F, 1 / 8);
  return slope;
}

/** Median edge width in mm over colonies `{ peak ΔE, steepest slope }`; null without any. */
export function edgeWidthMm(
  colonies: readonly { peak: number; steepest: number }[],
  mmPerPx: number,
): number | null {
  const widths = colonies
    .filter((c) => c.steepest > 0 && c.peak > 0)
    .map((c) => (c.peak / c.steepest) * mmPerPx)
    .sort((a, b) => a - b);
  if (widths.length === 0) return null;
  return widths[widths.length >> 1]!;
}
