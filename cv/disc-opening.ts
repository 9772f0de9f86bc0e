import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';

/**
 * Morphological opening of a 0/255 mask by a disc of `radius` pixels, from two Euclidean distance
 * transforms instead of an erosion and a dilation with the disc: erosion by a disc keeps the
 * pixels farther than `radius` from the background, and dilation by it adds the pixels within
 * `radius` of what was kept (the usual identity between binary morphology with discs and the
 * distance transform). Its cost does not grow with the disc: opencv.js erodes with an elliptical
 * kernel pixel by pixel, and a disc 16 pixels across cost ten times a distance transform.
 *
 * Output written to `dst` (8-bit 0/255); `src` may be `dst`.
 */
export function openWithDisc(cv: OpenCv, src: Mat, dst: Mat, radius: number): void {
  withMats((keep) => {
    // 255 off the eroded core, i.e. 0 exactly on the core: the next transform measures to it.
    const offCore = withinReach(cv, keep, src, radius);
    const opened = withinReach(cv, keep, offCore, radius);
    cv.bitwise_and(opened, src, dst);
  });
}

/** 0/255: the pixels within `radius` of a zero pixel of `mask` (exact Euclidean distance). */
function withinReach(cv: OpenCv, keep: Keep, mask: Mat, radius: number): Mat {
  const distance = keep(new cv.Mat());
  cv.distanceTransform(mask, distance, cv.DIST_L2, cv.DIST_MASK_PRECISE);
  cv.threshold(distance, distance, radius, 255, cv.THRESH_BINARY_INV);
  const near = keep(new cv.Mat());
  distance.convertTo(near, cv.CV_8U);
  return near;
}
