import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';

/**
 * Sharpness of colony edges, as an edge width in millimetres: the mean colony contrast divided by
 * the mean ΔE gradient along colony outlines. A step edge blurred by a Gaussian of σ has a
 * maximum slope of contrast / (σ·√(2π)), so this width grows in proportion to the blur, whatever
 * the colonies' colour. Returns null when there are no colonies to judge by.
 */
export function edgeWidthMm(
  cv: OpenCv,
  deltaE: Mat,
  mask: Mat,
  meanContrast: number,
  mmPerPx: number,
): number | null {
  if (meanContrast <= 0 || cv.countNonZero(mask) === 0) return null;
  return withMats((keep: Keep) => {
    const gx = keep(new cv.Mat());
    const gy = keep(new cv.Mat());
    cv.Sobel(deltaE, gx, cv.CV_32F, 1, 0, 3);
    cv.Sobel(deltaE, gy, cv.CV_32F, 0, 1, 3);
    const g = keep(new cv.Mat());
    cv.magnitude(gx, gy, g);
    const k = keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(3, 3)));
    const outer = keep(new cv.Mat());
    const inner = keep(new cv.Mat());
    cv.dilate(mask, outer, k);
    cv.erode(mask, inner, k);
    const ring = keep(new cv.Mat());
    cv.subtract(outer, inner, ring);
    // Sobel's 3×3 kernel weighs the central difference by 8 (2 per side × 4): undo it for ΔE/px.
    const slope = cv.mean(g, ring)[0]! / 8;
    if (slope <= 0) return null;
    return (meanContrast / slope) * mmPerPx;
  });
}
